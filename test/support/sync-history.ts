// Invented edit histories for the merge properties: a few devices edit a few records, pass versions to
// one another, and sometimes settle a conflict; every version with the versions it was built on.
import fc from 'fast-check';
import { maxRev, nextRev, type SyncRecord } from '../../core/records/index';
import { mergeIntoFrontier, ownKeptBases, recordKey, seenAfter, stampOf, type Frontier } from '../../core/sync/index';

export const DEVICES = ['dev-a', 'dev-b', 'dev-c'] as const;
export const RECORD_IDS = ['0b5a1c9e-3f0e-4c55-8a3e-1d2f00000001', '0b5a1c9e-3f0e-4c55-8a3e-1d2f00000002'] as const;
/** 2026-05-01T00:00:00Z, UTC ms: the invented start of every history. */
export const T0 = Date.UTC(2026, 4, 1);

/** One step of a history: a device edits (or settles) a record, or one device receives another's versions. */
export type Step =
  | { type: 'edit'; device: number; record: number; settle: boolean; wait_ms: number }
  | { type: 'receive'; from: number; to: number };

export const stepArb: fc.Arbitrary<Step> = fc.oneof(
  fc.record({
    type: fc.constant('edit' as const),
    device: fc.integer({ min: 0, max: DEVICES.length - 1 }),
    record: fc.integer({ min: 0, max: RECORD_IDS.length - 1 }),
    settle: fc.boolean(),
    wait_ms: fc.integer({ min: 0, max: 5000 }),
  }),
  fc.record({
    type: fc.constant('receive' as const),
    from: fc.integer({ min: 0, max: DEVICES.length - 1 }),
    to: fc.integer({ min: 0, max: DEVICES.length - 1 }),
  }),
);

/** Every version made, and for each its true parents (the versions it was built on), by revision. */
export interface History {
  versions: SyncRecord[];
  parents: Map<string, string[]>;
}

/** An invented site body named after its edit number (Tarn Brook, an invented stream). */
function body(n: number, updated_ms: number, seen: string[] | undefined) {
  const b = {
    code: 'TB-07', name: `Tarn Brook at weir, edit ${n}`, timeZone: 'Pacific/Auckland', displayUnits: 'metric' as const,
    jumpLimit_m: 0.25, updated_ms,
  };
  return seen ? { ...b, seen } : b;
}

/** Runs the steps: each device keeps its own state and clock, exactly as a phone would. */
export function runHistory(steps: readonly Step[]): History {
  const state = DEVICES.map(() => new Map<string, Frontier>());
  const clock = DEVICES.map(() => undefined as string | undefined);
  const made = DEVICES.map(() => [] as SyncRecord[]);
  const versions: SyncRecord[] = [];
  const parents = new Map<string, string[]>();
  let now = T0;
  for (const s of steps) {
    if (s.type === 'edit') {
      now += s.wait_ms + 1;
      const device = DEVICES[s.device];
      const id = RECORD_IDS[s.record];
      const key = recordKey('site', id);
      const f = state[s.device].get(key);
      const bases = f ? (s.settle ? [f.winner, ...f.others] : [f.winner]) : [];
      const rev = nextRev(clock[s.device], now, device);
      clock[s.device] = rev;
      // As the app does: `seen` also covers this device's own versions of the record still kept.
      const own = f && !s.settle ? ownKeptBases(device, f.others.map(stampOf)) : [];
      const seen = seenAfter(device, [...bases.map(stampOf), ...own]);
      const v = { kind: 'site', id, rev, body: body(versions.length, now, seen) } as SyncRecord;
      versions.push(v);
      parents.set(rev, bases.map((b) => b.rev));
      made[s.device].push(v);
      state[s.device].set(key, mergeIntoFrontier(f, v));
    } else {
      for (const f of state[s.from].values()) {
        for (const v of [f.winner, ...f.others]) {
          const key = recordKey(v.kind, v.id);
          state[s.to].set(key, mergeIntoFrontier(state[s.to].get(key), v));
          clock[s.to] = maxRev(clock[s.to], v.rev);
        }
      }
    }
  }
  return { versions, parents };
}

/**
 * True ancestry, by the definition in core/sync/ancestry.ts: b is a, or reachable from a through parents
 * (the versions each was built on) or an earlier version of the same record by the same device. A
 * device's order across different records is not followed: editing one record says nothing about which
 * versions of another the device had reviewed.
 */
export function isAncestor(h: History, a: SyncRecord, b: SyncRecord): boolean {
  const device = (rev: string) => rev.slice(21);
  const goal = b.rev;
  const stack = [a.rev];
  const visited = new Set<string>();
  while (stack.length) {
    const r = stack.pop() as string;
    if (r === goal) return true;
    if (visited.has(r)) continue;
    visited.add(r);
    stack.push(...(h.parents.get(r) ?? []));
    for (const v of h.versions) if (v.id === a.id && device(v.rev) === device(r) && v.rev < r) stack.push(v.rev);
  }
  return false;
}
