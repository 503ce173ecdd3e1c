// One writer for readings: no module but web/db/readings-write.ts may open a readwrite transaction on
// the `readings` store (nor use idb's put/add/delete/clear shortcuts on it, which open one), so the series
// and the revision clock can never be left behind. Checked with the TypeScript compiler's own types:
// the store argument's type must not admit 'readings' (a type parameter counts by its constraint; a plain
// string counts as "may be readings").
import { readdirSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const ROOT = resolve(import.meta.dirname, '../..');
const WRITER = 'web/db/readings-write.ts';
const FIXTURE = 'test/support/forbidden-readings-writes.ts';
const SHORTCUTS = new Set(['put', 'add', 'delete', 'clear']);

function sources(dir: string): string[] {
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
    return parts.some((p) => p === undefined) ? undefined : parts.flat() as string[];
  }
  if (type.isStringLiteral()) return [type.value];
  if (type.flags & ts.TypeFlags.String) return undefined;
  if (checker.isArrayType(type) || checker.isTupleType(type)) {
    const args = checker.getTypeArguments(type as ts.TypeReference);
    const parts = args.map((t) => literals(checker, t));
    return parts.some((p) => p === undefined) ? undefined : parts.flat() as string[];
  }
  return [];
}

const APP = [...sources('web'), ...sources('core'), ...sources('sw')];
let program: ts.Program | undefined;

/** One program over the app, the worker and the fixture, with the app's compiler options (built once). */
function compiled(): ts.Program {
  if (program) return program;
  const config = ts.getParsedCommandLineOfConfigFile(join(ROOT, 'tsconfig.json'), {}, { ...ts.sys, onUnRecoverableConfigFileDiagnostic: () => undefined });
  if (!config) throw new Error('cannot read tsconfig.json');
  program = ts.createProgram([...APP, FIXTURE].map((f) => join(ROOT, f)), { ...config.options, noEmit: true });
  return program;
}

/** True for a database handle (idb's IDBPDatabase or a raw IDBDatabase): it has both of these. */
function isDatabase(type: ts.Type): boolean {
  return !!type.getProperty('transaction') && !!type.getProperty('objectStoreNames');
}

/** "file:line method" for every readings write opened in the given files. */
function readingsWrites(files: string[]): string[] {
  const program = compiled();
  const checker = program.getTypeChecker();
  const found: string[] = [];
  for (const file of files) {
    const sf = program.getSourceFile(join(ROOT, file));
    if (!sf) throw new Error(`not compiled: ${file}`);
    const visit = (node: ts.Node): void => {
      if (ts.isCallExpression(node) && ts.isPropertyAccessExpression(node.expression)) {
        const method = node.expression.name.text;
        const onDb = isDatabase(checker.getTypeAtLocation(node.expression.expression));
        const [storeArg, modeArg] = node.arguments;
        let opens = false;
        if (onDb && method === 'transaction' && storeArg && modeArg) {
          const mode = literals(checker, checker.getTypeAtLocation(modeArg));
          opens = mode === undefined || mode.includes('readwrite');
        } else if (onDb && SHORTCUTS.has(method) && storeArg) opens = true;
        if (opens) {
          const stores = literals(checker, checker.getTypeAtLocation(storeArg));
          if (stores === undefined || stores.includes('readings')) {
            const line = sf.getLineAndCharacterOfPosition(node.getStart()).line + 1;
            found.push(`${relative(ROOT, sf.fileName)}:${line} ${method}`);
          }
        }
      }
      ts.forEachChild(node, visit);
    };
    visit(sf);
  }
  return found;
}

describe('the one readings writer', () => {
  it('finds every way of slipping in a readings write (so the check below can fail)', { timeout: 180_000 }, () => {
    expect(readingsWrites([FIXTURE])).toEqual([
      `${FIXTURE}:9 transaction`,
      `${FIXTURE}:14 transaction`,
      `${FIXTURE}:19 transaction`,
      `${FIXTURE}:24 put`,
    ]);
  });

  it('is the only module that opens a readwrite transaction on readings', { timeout: 180_000 }, () => {
    const found = readingsWrites(APP);
    expect(found.filter((f) => !f.startsWith(`${WRITER}:`))).toEqual([]);
    // The writer itself opens them (withReadingsWrite, saveReading, delete/restore, importReadings).
    expect(found.filter((f) => f.startsWith(`${WRITER}:`)).length).toBe(4);
  });
});
