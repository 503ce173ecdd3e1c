// Which version wins (core/sync/winner.ts), the one home of the rule: the higher revision. Checked against
// the hybrid logical clock's order (Kulkarni et al. 2014, "Logical Physical Clocks": by physical part, then
// the logical counter; ties between nodes broken by node id), and the merge's other entry points (decide,
// frontierOf, planMerge) must pick the same winner, so a second copy that drifted would fail here.
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatRev, parseRev, type SyncRecord } from '../../../core/records/index';
import { applyPlan, byRevision, decide, frontierOf, planMerge, winningVersion, winsOver } from '../../../core/sync/index';
import { join } from 'node:path';
import { ROOT, sources } from '../../support/store-writes';

const ID = '0b5a1c9e-3f0e-4c55-8a3e-1d2f00000009';
const revArb = fc.record({
  wall_ms: fc.integer({ min: 1_700_000_000_000, max: 1_700_000_100_000 }),
  counter: fc.integer({ min: 0, max: 3 }),
  deviceId: fc.constantFrom('dev-a', 'dev-b', 'office-1'),
});
const versionsArb = fc.uniqueArray(revArb.map(formatRev), { minLength: 1, maxLength: 8 }).map((revs) =>
  revs.map((rev, i) => ({ kind: 'site', id: ID, rev, body: { code: 'TB-07', name: `v${i}`, timeZone: 'UTC', displayUnits: 'metric', jumpLimit_m: 0.2, updated_ms: 0 } }) as SyncRecord),
);

/** The clock's own order, from the parts: physical time, then counter, then node id. */
function hlcOrder(a: string, b: string): number {
  const p = parseRev(a);
  const q = parseRev(b);
  return p.wall_ms - q.wall_ms || p.counter - q.counter || (p.deviceId < q.deviceId ? -1 : p.deviceId > q.deviceId ? 1 : 0);
}

describe('which version wins', () => {
  it('orders revisions as the hybrid logical clock does (time, counter, then device)', () => {
    fc.assert(
      fc.property(revArb.map(formatRev), revArb.map(formatRev), (a, b) => {
        expect(Math.sign(byRevision({ rev: a }, { rev: b }))).toBe(Math.sign(hlcOrder(a, b)));
        expect(winsOver({ rev: a }, { rev: b })).toBe(hlcOrder(a, b) > 0);
      }),
    );
  });

  it('decide, frontierOf and planMerge pick the winner winningVersion picks', () => {
    fc.assert(
      fc.property(versionsArb, (versions) => {
        const top = winningVersion(versions)!;
        expect(frontierOf(versions).winner.rev).toBe(top.rev);
        const state = applyPlan(new Map(), planMerge(versions, new Map(), 1_800_000_000_000));
        expect([...state.values()][0].winner.rev).toBe(top.rev);
        for (const v of versions) {
          const d = decide(v, top, { now_ms: 1_800_000_000_000 });
          expect(d.winner).toBe(v === top ? 'same' : 'incoming');
        }
      }),
    );
  });

  it('has no second copy: no other module compares two revisions to pick a version', () => {
    // A winner picked by comparing revisions in place (`a.rev > b.rev`, `x.rev < y.rev ? …`) would be a second
    // home of the rule. ancestry.ts compares revisions of one device (what a version knew), not winners.
    const allowed = new Set(['core/sync/winner.ts', 'core/sync/ancestry.ts']);
    const copies = [...sources('core'), ...sources('web'), ...sources('sw'), ...sources('office')]
      .filter((f) => !allowed.has(f))
      .flatMap((f) => readFileSync(join(ROOT, f), 'utf8').split('\n').map((line, i) => ({ f, i, line })))
      .filter(({ line }) => /\.rev\s*[<>]=?\s*[\w.]+\.rev\b/.test(line))
      .map(({ f, i }) => `${f}:${i + 1}`);
    expect(copies).toEqual([]);
  });
});
