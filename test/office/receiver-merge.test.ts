// The current version the receiver chooses in SQL is the one core's `decide` chooses, whatever order the
// versions arrive in and however they are grouped into bundles. The oracle is core/sync's decide folded
// over the versions, with revisions compared as ECMAScript compares strings (UTF-16 code units, ECMA-262
// §7.2.13 IsLessThan); the revisions include device ids that differ only in case, '-' or '_', where a
// language collation (en_US and the like) would order them differently from that.
import { expect, it } from 'vitest';
import { decide, formatRev, type SyncRecord } from '../../core/index';
import { storeBundle } from '../../office/receiver/store';
import { uniformGenerator } from '../support/noise';
import { bundleOf, siteRecord, T0_MS } from '../support/office/phones';
import { useOfficeFolder } from '../support/office/office-folder';

const office = useOfficeFolder('freshet-office-merge-', 'merge phone');

// Devices whose ids sort differently by code unit and by a language collation ('A' < '_' < 'a' by code unit).
const DEVICES = ['Ab', 'ab', 'a-b', 'a_b', 'aB', 'b'];

/** Versions of one site record: each a new name under a revision from one of DEVICES, some deleted. */
function versionsOf(id: string, n: number, u: () => number): SyncRecord[] {
  const base = siteRecord('ab');
  return Array.from({ length: n }, (_, i) => {
    // Few distinct wall times and counters, so revisions often differ only in the device id.
    const rev = formatRev({ wall_ms: T0_MS + Math.floor(u() * 3), counter: Math.floor(u() * 2), deviceId: DEVICES[Math.floor(u() * DEVICES.length)] });
    const deleted = u() < 0.2;
    return { ...base, id, rev, body: { ...base.body, name: `Version ${i} of ${id.slice(0, 4)}` }, ...(deleted ? { deleted: true } : {}) } as SyncRecord;
  });
}

/** Core's answer: decide folded over the versions in the order given. */
function coreWinner(versions: readonly SyncRecord[]): SyncRecord {
  let held: SyncRecord | undefined;
  for (const v of versions) if (held === undefined || decide(held, v, { now_ms: T0_MS }).winner === 'incoming') held = v;
  return held as SyncRecord;
}

it('chooses the current version as core/sync decide does, for any arrival order and grouping into bundles', async () => {
  const u = uniformGenerator(2311);
  const ids = Array.from({ length: 12 }, (_, k) => `7c0f${String(k).padStart(4, '0')}-1b7d-4c39-9e61-7a2d4b0c9f13`);
  // One version per distinct revision (a revision names one content), in a shuffled order.
  const all: SyncRecord[] = [];
  for (const id of ids) {
    const seen = new Set<string>();
    for (const v of versionsOf(id, 9, u)) if (!seen.has(v.rev)) (seen.add(v.rev), all.push(v));
  }
  for (let i = all.length - 1; i > 0; i--) {
    const j = Math.floor(u() * (i + 1));
    [all[i], all[j]] = [all[j], all[i]];
  }
  // Bundles of 1 to 7 versions, so some records meet several of their versions within one bundle.
  for (let at = 0; at < all.length; ) {
    const size = 1 + Math.floor(u() * 7);
    const out = await storeBundle(office.db, bundleOf('merge', all.slice(at, at + size)), office.deviceNo);
    expect(out.status).toBe('stored');
    at += size;
  }
  const rows = await office.db.query<{ id: string; rev: string; deleted: boolean; name: string }>(
    `select id::text as id, rev, deleted, body ->> 'name' as name from current_records order by id`);
  const expected = ids.map((id) => {
    const w = coreWinner(all.filter((v) => v.id === id));
    return { id, rev: w.rev, deleted: w.deleted === true, name: (w.body as { name: string }).name };
  });
  expect(rows).toEqual(expected);
  const [n] = await office.db.query<{ n: string }>('select count(*)::text as n from record_versions');
  expect(Number(n.n)).toBe(all.length);
}, 120_000);
