// Merge rules, pure (core/sync): properties over invented edit histories (fast-check). The expected state
// is computed independently from each history's true ancestry: for every record, the versions no other
// version descends from (the maximal elements of the causal order, Lamport 1978 "Time, Clocks, and the
// Ordering of Events"; version vectors, Parker et al. 1983); the winner is the highest revision.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { formatRev, validateSyncRecord, type SyncRecord } from '../../../core/records/index';
import {
  applyPlan, decide, descends, frontierOf, planMerge, recordKey, stampOf, AHEAD_TOLERANCE_MS, type Frontier,
} from '../../../core/sync/index';
import { isAncestor, runHistory, stepArb, T0, type History, type Step } from '../../support/sync-history';

const stepsArb = fc.array(stepArb, { minLength: 1, maxLength: 40 });

/** Applies bundles one after another to an empty replica, as import or pull does. */
function replay(bundles: readonly SyncRecord[][], now_ms = T0 + 86_400_000): Map<string, Frontier> {
  let state = new Map<string, Frontier>();
  for (const b of bundles) state = applyPlan(state, planMerge(b, state, now_ms));
  return state;
}

/** The state in a comparable form: per record, the winner's revision and the kept revisions. */
function canonical(state: Map<string, Frontier>): string {
  return JSON.stringify([...state].sort(([a], [b]) => (a < b ? -1 : 1)).map(([k, f]) => [k, f.winner.rev, f.others.map((o) => o.rev)]));
}

/** Splits versions into bundles of random sizes and order. */
const bundlesOf = (versions: SyncRecord[]) =>
  fc.shuffledSubarray(versions, { minLength: versions.length, maxLength: versions.length }).chain((shuffled) =>
    fc.array(fc.integer({ min: 1, max: 4 }), { minLength: shuffled.length, maxLength: shuffled.length }).map((sizes) => {
      const out: SyncRecord[][] = [];
      for (let i = 0, s = 0; i < shuffled.length; i += sizes[s++]) out.push(shuffled.slice(i, i + sizes[s]));
      return out;
    }),
  );

/** The expected kept versions of each record, from the true ancestry alone. */
function expected(h: History): string {
  const byKey = new Map<string, SyncRecord[]>();
  for (const v of h.versions) {
    const k = recordKey(v.kind, v.id);
    byKey.set(k, [...(byKey.get(k) ?? []), v]);
  }
  const state = new Map<string, Frontier>();
  for (const [k, vs] of byKey) {
    const maximal = vs.filter((v) => !vs.some((u) => u !== v && isAncestor(h, u, v))).sort((a, b) => (a.rev < b.rev ? -1 : 1));
    const top = vs.reduce((a, b) => (b.rev > a.rev ? b : a));
    state.set(k, { winner: top, others: maximal.filter((m) => m !== top) });
  }
  return canonical(state);
}

describe('ancestry', () => {
  it('descends(a, b) holds exactly when b is a true ancestor of a (or a itself)', () => {
    fc.assert(
      fc.property(stepsArb, (steps) => {
        expect(disagreements(runHistory(steps))).toEqual([]);
      }),
      { numRuns: 150 },
    );
  });
});

/** Every ordered pair of versions of one record where descends and the reference disagree. */
function disagreements(h: History): string[] {
  const out: string[] = [];
  for (const a of h.versions) {
    for (const b of h.versions) {
      if (a.id === b.id && descends(stampOf(a), stampOf(b)) !== isAncestor(h, a, b)) out.push(`${a.rev} / ${b.rev}`);
    }
  }
  return out;
}

// Histories found by the property above (fast-check seeds -1762558261 and 289725553, shrunk), kept as fixed
// cases. Both times the reference of the day followed a device's order across records: device A edited
// record 0 after receiving C's versions of both records, so it claimed A's later edit of record 1 knew C's
// version of record 1, which A still held as an open conflict. The rule (core/sync/ancestry.ts): a version
// knows what it was built on and its own device's earlier versions of the same record, never anything
// through another record.
const E = (device: number, record: number, wait_ms = 0): Step => ({ type: 'edit', device, record, settle: false, wait_ms });
const R = (from: number, to: number): Step => ({ type: 'receive', from, to });
const SEED_289725553: Step[] = [E(2, 1), E(2, 0), E(0, 1), R(2, 0), E(0, 0), E(0, 1)];
const SEED_NEG_1762558261: Step[] = [E(0, 0), E(0, 1), E(1, 0), R(0, 1), R(1, 2), E(2, 1), E(2, 0), R(0, 0)];

describe('ancestry: fixed cases', () => {
  it('an edit of another record teaches nothing about this one (seed 289725553)', () => {
    const h = runHistory(SEED_289725553);
    const [c1, , a1, , a1again] = h.versions;
    expect([c1.id, a1.id, a1again.id]).toEqual([c1.id, c1.id, c1.id]);
    // dev-a's second edit of record 1 was built on its own first one only; dev-c's version stays concurrent.
    expect(descends(stampOf(a1again), stampOf(c1))).toBe(false);
    expect(isAncestor(h, a1again, c1)).toBe(false);
    expect(descends(stampOf(a1again), stampOf(a1))).toBe(true);
    expect(frontierOf([a1again, c1]).others.map((o) => o.rev)).toEqual([c1.rev]);
    expect(disagreements(h)).toEqual([]);
  });

  it('agrees with the reference on the second history found (seed -1762558261)', () => {
    const h = runHistory(SEED_NEG_1762558261);
    expect(h.versions).toHaveLength(5);
    expect(disagreements(h)).toEqual([]);
  });

  it("a new version carries what its device's own kept version knew, so merge order does not matter", () => {
    // dev-a edits on top of dev-c's version; dev-b's later, concurrent version wins at dev-a; dev-a edits that.
    const h = runHistory([E(2, 0), R(2, 0), E(0, 0), E(1, 0, 10), R(1, 0), E(0, 0)]);
    const [c1, a1, b1, a2] = h.versions;
    expect(isAncestor(h, a2, c1)).toBe(true); // through a1, dev-a's own earlier version of the record
    expect(descends(stampOf(a2), stampOf(c1))).toBe(true);
    expect(a2.body.seen).toEqual([c1.rev, b1.rev]);
    const forward = replay([[c1], [a1], [b1], [a2]]);
    const backward = replay([[a2], [b1], [a1], [c1]]);
    expect(canonical(backward)).toBe(canonical(forward));
    expect([...forward.values()].map((f) => [f.winner.rev, f.others.length])).toEqual([[a2.rev, 0]]);
    expect(disagreements(h)).toEqual([]);
  });
});

describe('merge of bundles', () => {
  it('keeps exactly the versions no other version descends from; the highest revision wins', () => {
    fc.assert(
      fc.property(stepsArb.map(runHistory).chain((h) => fc.tuple(fc.constant(h), bundlesOf(h.versions))), ([h, bundles]) => {
        expect(canonical(replay(bundles))).toBe(expected(h));
      }),
      { numRuns: 200 },
    );
  });

  it('ends in the same state whatever order the bundles arrive in', () => {
    fc.assert(
      fc.property(
        stepsArb.map(runHistory).chain((h) => bundlesOf(h.versions).chain((b) => fc.tuple(fc.constant(b), fc.shuffledSubarray(b, { minLength: b.length, maxLength: b.length })))),
        ([bundles, reordered]) => {
          expect(canonical(replay(reordered))).toBe(canonical(replay(bundles)));
        },
      ),
      { numRuns: 200 },
    );
  });

  it('is idempotent: a bundle applied again changes nothing and is counted as unchanged', () => {
    fc.assert(
      fc.property(stepsArb.map(runHistory).chain((h) => bundlesOf(h.versions)), (bundles) => {
        const state = replay(bundles);
        for (const b of bundles) {
          const again = planMerge(b, state, T0 + 86_400_000);
          expect(again.changes.size).toBe(0);
          expect(again.summary.unchanged).toBe(b.length);
        }
        expect(canonical(replay([...bundles, ...bundles]))).toBe(canonical(state));
      }),
      { numRuns: 150 },
    );
  });

  it('drops nothing silently: every version received is kept or known to a kept version', () => {
    fc.assert(
      fc.property(stepsArb.map(runHistory).chain((h) => fc.tuple(fc.constant(h), bundlesOf(h.versions))), ([h, bundles]) => {
        const state = replay(bundles);
        for (const v of h.versions) {
          const f = state.get(recordKey(v.kind, v.id)) as Frontier;
          expect([f.winner, ...f.others].some((k) => descends(stampOf(k), stampOf(v)))).toBe(true);
        }
      }),
      { numRuns: 150 },
    );
  });
});

const SITE_ID = '5e1f00aa-2b3c-4d5e-8f60-000000000042';
function version(rev: string, name: string, seen?: string[]): SyncRecord {
  const body = { code: 'OW-02', name, timeZone: 'Europe/Oslo', displayUnits: 'metric' as const, jumpLimit_m: 0.4, updated_ms: T0 };
  return { kind: 'site', id: SITE_ID, rev, body: seen ? { ...body, seen } : body } as SyncRecord;
}
const rev = (wall_ms: number, deviceId: string, counter = 0) => formatRev({ wall_ms, counter, deviceId });

describe('decide (the pairwise rule the office receiver uses)', () => {
  const agreed = version(rev(T0, 'phone-1'), 'Owl Water at ford');
  const onPhone = version(rev(T0 + 60_000, 'phone-1'), 'Owl Water at the ford');
  const atOffice = version(rev(T0 + 120_000, 'office'), 'Owl Water at old ford', [agreed.rev]);
  const now = { now_ms: T0 + 3_600_000 };

  it('the same revision is the same record', () => {
    expect(decide(agreed, agreed, now)).toEqual({ winner: 'same' });
  });

  it('keeps the loser when both sides changed since they last agreed', () => {
    // Both edited from `agreed`: the office's later revision wins; the phone's edit is kept for review.
    expect(decide(onPhone, atOffice, now)).toEqual({ winner: 'incoming', keepLoser: 'concurrent', ahead: false });
    expect(decide(atOffice, onPhone, now)).toEqual({ winner: 'stored', keepLoser: 'concurrent', ahead: false });
  });

  it('lets an older version go when the winner was made knowing it', () => {
    expect(decide(agreed, atOffice, now)).toEqual({ winner: 'incoming', ahead: false });
    expect(decide(atOffice, agreed, now)).toEqual({ winner: 'stored', ahead: false });
    expect(decide(agreed, onPhone, now)).toEqual({ winner: 'incoming', ahead: false });
  });

  it('flags a winner dated ahead of the receiver clock and keeps what it replaced, but still applies it', () => {
    // A phone whose date is a year ahead: its revision wins by the rule (every replica must agree) ...
    const wrongDate = version(rev(T0 + 365 * 86_400_000, 'phone-2'), 'Owl Water (wrong date)', [agreed.rev]);
    expect(decide(agreed, wrongDate, now)).toEqual({ winner: 'incoming', keepLoser: 'ahead', ahead: true });
    // ... and a later honest edit loses to it, kept as a conflict: it cannot win unseen.
    expect(decide(wrongDate, onPhone, now)).toEqual({ winner: 'stored', keepLoser: 'concurrent', ahead: true });
    expect(decide(undefined, wrongDate, now)).toEqual({ winner: 'incoming', ahead: true });
  });

  it('flags only beyond the tolerance', () => {
    const edge = version(rev(now.now_ms + AHEAD_TOLERANCE_MS, 'phone-2'), 'edge', [agreed.rev]);
    const past = version(rev(now.now_ms + AHEAD_TOLERANCE_MS + 1, 'phone-2'), 'past', [agreed.rev]);
    expect(decide(agreed, edge, now)).toEqual({ winner: 'incoming', ahead: false });
    expect(decide(agreed, past, now)).toEqual({ winner: 'incoming', keepLoser: 'ahead', ahead: true });
  });

  it('refuses to compare versions of two different records', () => {
    const other = { ...agreed, id: '5e1f00aa-2b3c-4d5e-8f60-000000000043' };
    expect(() => decide(agreed, other, now)).toThrow(/one record/);
  });
});

describe('planMerge summary and flags', () => {
  it('counts new, updated, conflicts, unchanged and ahead-dated winners', () => {
    const a = version(rev(T0, 'phone-1'), 'A');
    const b = version(rev(T0 + 1000, 'phone-1'), 'B');
    const c = version(rev(T0 + 2000, 'phone-2'), 'C', [a.rev]);
    const state = new Map([[recordKey('site', SITE_ID), frontierOf([b])]]);
    const plan = planMerge([a, c], state, T0 + 10_000);
    // a: older than b and known to it (same device) → unchanged; c: concurrent with b, higher → wins, b kept.
    expect(plan.summary).toEqual({ new: 0, updated: 1, conflicts: 1, unchanged: 1, ahead: 0, byKind: { site: { new: 0, updated: 1 } } });
    const after = applyPlan(state, plan).get(recordKey('site', SITE_ID)) as Frontier;
    expect(after.winner.rev).toBe(c.rev);
    expect(after.others.map((o) => o.rev)).toEqual([b.rev]);
  });

  it('reports a new record dated a day ahead, and none within ten minutes', () => {
    const ahead = version(rev(T0 + 86_400_000, 'phone-3'), 'ahead');
    const plan = planMerge([ahead], new Map(), T0);
    expect(plan.ahead.map((f) => f.record.rev)).toEqual([ahead.rev]);
    expect(plan.summary.ahead).toBe(1);
    expect(planMerge([version(rev(T0 + 9 * 60_000, 'phone-3'), 'close')], new Map(), T0).ahead).toEqual([]);
  });

  it('a version with a seen list is a valid sync record; a bad seen list is refused', () => {
    expect(() => validateSyncRecord(version(rev(T0, 'phone-1'), 'ok', [rev(T0 - 5, 'office')]))).not.toThrow();
    expect(() => validateSyncRecord(version(rev(T0, 'phone-1'), 'bad', ['yesterday']))).toThrow(/body\.seen\[0\]/);
    expect(() => validateSyncRecord(version(rev(T0, 'phone-1'), 'twice', [rev(T0 - 5, 'office'), rev(T0 - 9, 'office')]))).toThrow(/one revision per device/);
  });
});
