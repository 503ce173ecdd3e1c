// Finds, with the TypeScript compiler's own types, every write to an IndexedDB store in the given source
// files: put/add/delete/clear on an object store (typed, raw through idb's unwrap, or reached through a
// structural `objectStore(name)` type), idb's database shortcuts (db.put('readings', …)), and readwrite
// transactions opened over a store list. A store the types cannot pin down (a plain string) counts as
// "may be any store". Used by test/db/one-writer.test.ts.
import { readdirSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import ts from 'typescript';

/** The repository root. */
export const ROOT = resolve(import.meta.dirname, '../..');

/** One write found: where, how, and the stores it may touch (undefined: any store). */
export interface StoreWrite {
  file: string;
  line: number;
  method: string;
  stores: string[] | undefined;
}

const WRITES = new Set(['put', 'add', 'delete', 'clear']);

/** Every .ts/.tsx source under dir (relative to the root), .d.ts left out. */
export function sources(dir: string): string[] {
  return readdirSync(join(ROOT, dir)).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(join(ROOT, path)).isDirectory()) return sources(path);
    return /\.tsx?$/.test(name) && !name.endsWith('.d.ts') ? [path] : [];
  });
}

/** String values a type admits; undefined when it admits any string. */
function literals(checker: ts.TypeChecker, type: ts.Type): string[] | undefined {
  if (type.flags & ts.TypeFlags.TypeParameter) {
    const c = checker.getBaseConstraintOfType(type);
    return c && c !== type ? literals(checker, c) : undefined;
  }
  if (type.isUnion()) {
    const parts = type.types.map((t) => literals(checker, t));
    return parts.some((p) => p === undefined) ? undefined : (parts.flat() as string[]);
  }
  if (type.isStringLiteral()) return [type.value];
  if (type.flags & ts.TypeFlags.String) return undefined;
  if (checker.isArrayType(type) || checker.isTupleType(type)) {
    const args = checker.getTypeArguments(type as ts.TypeReference);
    const parts = args.map((t) => literals(checker, t));
    return parts.some((p) => p === undefined) ? undefined : (parts.flat() as string[]);
  }
  return [];
}

/** True for a database handle (idb's IDBPDatabase or a raw IDBDatabase). */
function isDatabase(type: ts.Type): boolean {
  return !!type.getProperty('transaction') && !!type.getProperty('objectStoreNames');
}

const strip = (e: ts.Expression): ts.Expression =>
  ts.isParenthesizedExpression(e) || ts.isAsExpression(e) || ts.isNonNullExpression(e) || ts.isTypeAssertionExpression(e) ? strip(e.expression) : e;

/**
 * The stores an expression's object store may be: null when it is no object store at all, undefined
 * when it may be any store.
 */
function storesOf(checker: ts.TypeChecker, expr: ts.Expression, depth = 0): string[] | undefined | null {
  const e = strip(expr);
  if (depth < 8 && ts.isIdentifier(e)) {
    const decl = checker.getSymbolAtLocation(e)?.valueDeclaration;
    if (decl && ts.isVariableDeclaration(decl) && decl.initializer) return storesOf(checker, decl.initializer, depth + 1);
  }
  if (ts.isCallExpression(e)) {
    const callee = strip(e.expression);
    if (ts.isPropertyAccessExpression(callee) && callee.name.text === 'objectStore' && e.arguments[0]) {
      return literals(checker, checker.getTypeAtLocation(e.arguments[0]));
    }
    if (ts.isIdentifier(callee) && callee.text === 'unwrap' && e.arguments[0]) return storesOf(checker, e.arguments[0], depth + 1);
  }
  const type = checker.getTypeAtLocation(e);
  if (!type.getProperty('indexNames') || !type.getProperty('put')) return null;
  // idb's typed store: IDBPObjectStore<DB, TxStores, StoreName, Mode> (its `name` is a plain string).
  if (type.symbol?.name === 'IDBPObjectStore') {
    const args = checker.getTypeArguments(type as ts.TypeReference);
    if (args[2]) return literals(checker, args[2]);
  }
  const name = type.getProperty('name');
  return name ? literals(checker, checker.getTypeOfSymbolAtLocation(name, e)) : undefined;
}

let program: ts.Program | undefined;

/** One program over the app, the worker and the given extra files, with the app's compiler options. */
function compiled(files: readonly string[]): ts.Program {
  if (program && files.every((f) => program!.getSourceFile(join(ROOT, f)))) return program;
  const config = ts.getParsedCommandLineOfConfigFile(join(ROOT, 'tsconfig.json'), {}, { ...ts.sys, onUnRecoverableConfigFileDiagnostic: () => undefined });
  if (!config) throw new Error('cannot read tsconfig.json');
  program = ts.createProgram(files.map((f) => join(ROOT, f)), { ...config.options, noEmit: true });
  return program;
}

/**
 * Every store write in `files` (paths from the root), compiled together with `all` (the whole program,
 * built once). A readwrite transaction counts as a write to its store list under method 'transaction'.
 */
export function storeWrites(files: readonly string[], all: readonly string[] = files): StoreWrite[] {
  const p = compiled([...new Set([...all, ...files])]);
  const checker = p.getTypeChecker();
  const found: StoreWrite[] = [];
  for (const file of files) {
    const sf = p.getSourceFile(join(ROOT, file));
    if (!sf) throw new Error(`not compiled: ${file}`);
    const visit = (node: ts.Node): void => {
      if (ts.isCallExpression(node) && ts.isPropertyAccessExpression(node.expression)) {
        const method = node.expression.name.text;
        const target = node.expression.expression;
        const [first, second] = node.arguments;
        const line = sf.getLineAndCharacterOfPosition(node.getStart()).line + 1;
        const at = { file: relative(ROOT, sf.fileName), line, method };
        const onDb = isDatabase(checker.getTypeAtLocation(target));
        if (onDb && method === 'transaction' && first && second) {
          const mode = literals(checker, checker.getTypeAtLocation(second));
          if (mode === undefined || mode.includes('readwrite')) found.push({ ...at, stores: literals(checker, checker.getTypeAtLocation(first)) });
        } else if (onDb && WRITES.has(method) && first) {
          found.push({ ...at, stores: literals(checker, checker.getTypeAtLocation(first)) });
        } else if (!onDb && WRITES.has(method)) {
          const stores = storesOf(checker, target);
          if (stores !== null) found.push({ ...at, stores });
        }
      }
      ts.forEachChild(node, visit);
    };
    visit(sf);
  }
  return found;
}
