// Every multi-store transaction takes its store list from web/db/stores.ts (SCOPES, built from the one
// table of the stores): no module of the app or the worker spells a list of store names by hand, whether
// it goes to `transaction(` directly, to the readings writer's `also`, or into a constant built first.
// A source scan with the TypeScript parser: an array literal that holds a store name as a string.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';
import { SCOPES, STORE_NAMES } from '../../web/db/stores';
import { ROOT, sources } from '../support/store-writes';

const HOME = 'web/db/stores.ts';
const NAMES = new Set<string>(STORE_NAMES);

const strip = (e: ts.Expression): ts.Expression =>
  ts.isAsExpression(e) || ts.isParenthesizedExpression(e) || ts.isSatisfiesExpression(e) ? strip(e.expression) : e;

/** "file:line" of each array literal in `text` that holds a store name as a string literal. */
function handWrittenLists(file: string, text: string): string[] {
  const sf = ts.createSourceFile(file, text, ts.ScriptTarget.ES2022, true, file.endsWith('.tsx') ? ts.ScriptKind.TSX : ts.ScriptKind.TS);
  const found: string[] = [];
  const visit = (node: ts.Node): void => {
    if (ts.isArrayLiteralExpression(node)) {
      const named = node.elements.some((el) => {
        const e = ts.isSpreadElement(el) ? el.expression : strip(el);
        return ts.isStringLiteralLike(e) && NAMES.has(e.text);
      });
      if (named) found.push(`${file}:${sf.getLineAndCharacterOfPosition(node.getStart()).line + 1}`);
    }
    ts.forEachChild(node, visit);
  };
  visit(sf);
  return found;
}

describe('store lists come from the one table (web/db/stores.ts)', () => {
  it('the scan finds a hand-written list in every form it takes (so the check below can fail)', () => {
    const fixture = [
      "const a = db.transaction(['outbox', 'sync'], 'readwrite');",
      "const b = db.transaction([...SCOPES.readingsWrite, 'conflicts'], 'readwrite');",
      "const c = withReadingsWrite(['loggerDays'], fn);",
      "const d = db.transaction(uniqueStores([store, 'meta', ...(x ? ['drafts' as const] : [])]));",
      "const SCOPE: StoreName[] = [...SYNCED_STORES, 'series'];",
      "const ok1 = db.transaction('meta', 'readwrite');",
      "const ok2 = db.transaction(SCOPES.outbox, 'readwrite');",
      "const ok3 = afterWrite(['reading', 'draft']);",
    ].join('\n');
    expect(handWrittenLists('fixture.ts', fixture)).toEqual(['fixture.ts:1', 'fixture.ts:2', 'fixture.ts:3', 'fixture.ts:4', 'fixture.ts:4', 'fixture.ts:5']);
  });

  it('no module of the app or the worker spells a store list by hand', () => {
    const files = [...sources('web'), ...sources('sw')].filter((f) => f !== HOME);
    expect(files.length).toBeGreaterThan(50);
    expect(files.flatMap((f) => handWrittenLists(f, readFileSync(join(ROOT, f), 'utf8')))).toEqual([]);
  });

  it('every named list names stores of the table, each once', () => {
    for (const [name, list] of Object.entries(SCOPES)) {
      expect(list.length, name).toBeGreaterThan(0);
      expect(new Set(list).size, name).toBe(list.length);
      for (const s of list) expect(NAMES.has(s), `${name}: ${s}`).toBe(true);
    }
  });
});
