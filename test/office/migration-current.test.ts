// Migration 4 replaces the table of current records by a view over the versions. An office database made
// before it (steps 1 to 3, its current table written by the old upsert) must read the same current records
// after it, and the exports by site must find the same records. The oracle for which version is current is
// core/sync's decide (as receiver-merge.test.ts), here folded over versions written straight into a step-3
// database with revisions that differ only in the case of their device id.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { decide, formatRev, type SyncRecord } from '../../core/index';
import { openPglite, type Database } from '../../office/receiver/db';
import { siteRecordsFromDatabase } from '../../office/receiver/export-source';
import { migrate } from '../../office/receiver/migrations';
import { readingRecords, siteRecord, SITE_ID, T0_MS } from '../support/office/phones';

const dir = mkdtempSync(join(tmpdir(), 'freshet-office-migrate-'));
let db: Database;

beforeAll(async () => {
  db = await openPglite(dir);
  expect(await migrate(db, 3)).toEqual([1, 2, 3]);
}, 120_000);

afterAll(async () => {
  await db?.close();
  rmSync(dir, { recursive: true, force: true });
});

const OTHER_SITE = '0b6f3c1e-9d2a-4e57-8c40-3f1a5e7b2d90';

/** Core's answer for one record: decide folded over its versions in the order given. */
function winner(versions: readonly SyncRecord[]): SyncRecord {
  let held: SyncRecord | undefined;
  for (const v of versions) if (held === undefined || decide(held, v, { now_ms: T0_MS }).winner === 'incoming') held = v;
  return held as SyncRecord;
}

it('reads the same current records after the step as the step-3 table held, and exports the same by site', async () => {
  const site = siteRecord('ab');
  const [r1, r2, r3] = readingRecords('ab', 3);
  const rev = (ms: number, device: string) => formatRev({ wall_ms: T0_MS + 86_400_000 + ms, counter: 0, deviceId: device });
  // r1 edited twice ('Ab' < 'ab' by code unit: the later device id wins at the same time), r2 deleted, r3
  // moved to another site: it named this site once and no longer does.
  const versions: SyncRecord[] = [
    site,
    { ...r1, rev: rev(5, 'Ab'), body: { ...r1.body, stage_m: 0.5 } },
    { ...r1, rev: rev(5, 'ab'), body: { ...r1.body, stage_m: 0.51 } },
    r1,
    r2,
    { ...r2, rev: rev(9, 'ab'), deleted: true },
    r3,
    { ...r3, rev: rev(7, 'ab'), body: { ...r3.body, siteId: OTHER_SITE } },
  ];
  await db.query(`insert into office_devices (name, token_hash) values ('migrating phone', 'x')`);
  await db.query(`insert into office_bundles (seq, id, device_no, bundle_device, created, checksum, record_count, document)
                  values (1, '3d1f0a52-6c7e-4b8d-9a13-2e5f7c9b0a41', 1, 'ab', 'x', 'x', $1, '{}')`, [versions.length]);
  for (const v of versions) {
    await db.query(`insert into record_versions (kind, id, rev, deleted, body, device, bundle_id, received_at, seq)
                    values ($1, $2, $3, $4, $5, 'ab', '3d1f0a52-6c7e-4b8d-9a13-2e5f7c9b0a41', now(), 1)`,
    [v.kind, v.id, v.rev, v.deleted === true, JSON.stringify(v.body)]);
  }
  const ids = [...new Set(versions.map((v) => v.id))];
  for (const id of ids) {
    const w = winner(versions.filter((v) => v.id === id));
    await db.query(`insert into current_records (kind, id, rev, deleted, body, seq) values ($1, $2, $3, $4, $5, 1)`,
      [w.kind, w.id, w.rev, w.deleted === true, JSON.stringify(w.body)]);
  }
  const read = () => db.query<{ kind: string; id: string; rev: string; deleted: boolean; body: unknown; seq: string }>(
    'select kind, id::text as id, rev, deleted, body, seq::text as seq from current_records order by kind, id');
  const before = await read();
  expect(before).toHaveLength(4);

  expect(await migrate(db, 4)).toEqual([4]);
  expect(await read()).toEqual(before);
  // The export by site: the site, and r1's latest version; not the deleted r2, not r3 that moved away.
  const exported = await siteRecordsFromDatabase(db, 'TB-02');
  expect(exported.map((r) => [r.kind, r.id, r.rev])).toEqual([
    ['reading', r1.id, rev(5, 'ab')],
    ['site', SITE_ID, site.rev],
  ]);
  expect(exported[0].body).toEqual({ ...r1.body, stage_m: 0.51 });
}, 120_000);
