// Sync storage on fake-indexeddb: merging incoming records in one transaction (series kept in step,
// conflicts kept, all or nothing, cursor with the merge), settling conflicts, the outbox and its marks.
import { describe, expect, it } from 'vitest';
import { DEMO_SITE_ID, formatRev, parseRev, toSyncRecord, type SyncRecord } from '../../core/index';
import { acknowledge, applyIncoming, exportBundle, getReading, getSite, getSyncValue, listConflicts, markExported, nextOutgoing, previewIncoming, saveReading, saveSite, settleConflict, waitingCount } from '../../web/db/index';
import { getDb } from '../../web/db/connection';
import { getMeta } from '../../web/db/meta';
import { readingSeries } from '../../web/db/series-read';
import { reading, site, T0 } from '../support/records';
import { useFreshDb } from '../support/db';

const { clock } = useFreshDb();
const OFFICE = 'office-1';
const SITE = '3c0d4b1e-7a2f-4e11-9b0a-00000000a001';
const rev = (wall_ms: number, device = OFFICE, counter = 0) => formatRev({ wall_ms, counter, deviceId: device });

function officeSite(wall_ms: number, name: string, seen?: string[]): SyncRecord {
  const body = { ...site({ name }), updated_ms: wall_ms };
  return { kind: 'site', id: SITE, rev: rev(wall_ms), body: seen ? { ...body, seen } : body } as SyncRecord;
}
function officeReading(n: number, wall_ms: number): SyncRecord {
  const id = `3c0d4b1e-7a2f-4e11-9b0a-00000000b${String(n).padStart(3, '0')}`;
  return { kind: 'reading', id, rev: rev(wall_ms), body: { ...reading(SITE, T0 + n * 900_000, [0, 0.41, 0.42][n]), updated_ms: wall_ms } } as SyncRecord;
}

describe('applyIncoming', () => {
  it('stores new records and their series, stores the cursor, and a second apply changes nothing', async () => {
    const incoming = [officeSite(clock.now - 5000, 'Fern Gully at bridge'), officeReading(1, clock.now - 4000), officeReading(2, clock.now - 4000)];
    const first = await applyIncoming(incoming, { cursor: 'c-17' });
    expect(first.summary).toMatchObject({ new: 3, updated: 0, conflicts: 0, unchanged: 0, ahead: 0 });
    expect((await getSite(SITE))?.name).toBe('Fern Gully at bridge');
    const series = await readingSeries(SITE, T0, T0 + 86_400_000);
    expect(Array.from(series.stage_m)).toEqual([0.41, 0.42]);
    expect(await getSyncValue('cursor')).toBe('c-17');
    const again = await applyIncoming(incoming);
    expect(again.summary).toMatchObject({ new: 0, updated: 0, conflicts: 0, unchanged: 3 });
    expect(Array.from((await readingSeries(SITE, T0, T0 + 86_400_000)).stage_m)).toEqual([0.41, 0.42]);
  });

  it('writes nothing, not even the cursor, when one write of the merge fails', async () => {
    const bad = officeReading(2, clock.now - 4000);
    // Passes the record checks (unknown fields are not checked) but cannot be stored: the put throws.
    (bad.body as unknown as Record<string, unknown>).extra = () => 1;
    const err = await applyIncoming([officeSite(clock.now - 5000, 'Fern Gully'), officeReading(1, clock.now - 4000), bad], { cursor: 'c-18' }).catch((e: unknown) => e);
    expect(err).toMatchObject({ name: 'StorageError' });
    expect(await getSite(SITE)).toBeUndefined();
    expect(await getReading(officeReading(1, 0).id)).toBeUndefined();
    expect((await readingSeries(SITE, T0, T0 + 86_400_000)).time_ms.length).toBe(0);
    expect(await getSyncValue('cursor')).toBeUndefined();
  });

  it('refuses an invalid record before writing anything, naming it', async () => {
    const broken = { ...officeReading(1, clock.now), body: { ...officeReading(1, clock.now).body, stage_m: 'high' } } as unknown as SyncRecord;
    await expect(applyIncoming([officeSite(clock.now, 'x'), broken])).rejects.toThrow(/records\[1\]\.stage_m/);
    expect(await getSite(SITE)).toBeUndefined();
  });

  it('keeps the phone’s edit for review when the office changed the same site since they last agreed, and settles it', async () => {
    const agreed = officeSite(clock.now - 60_000, 'Fern Gully at bridge');
    await applyIncoming([agreed]);
    const local = await saveSite({ ...(await getSite(SITE))!, name: 'Fern Gully at the footbridge' });
    expect(local.seen).toEqual([agreed.rev]);
    // The office edits the agreed version too, without having seen the phone's edit.
    const theirs = officeSite(clock.now + 1000, 'Fern Gully at old bridge');
    const preview = await previewIncoming([theirs]);
    expect(preview.summary).toMatchObject({ updated: 1, conflicts: 1 });
    expect(await listConflicts()).toEqual([]);
    await applyIncoming([theirs]);
    // The office's revision is later: its name is in use, the phone's edit waits for review.
    expect((await getSite(SITE))?.name).toBe('Fern Gully at old bridge');
    const [c] = await listConflicts(SITE);
    expect(c).toMatchObject({ reason: 'concurrent', winnerRev: theirs.rev });
    expect((c.losing.body as { name: string }).name).toBe('Fern Gully at the footbridge');
    clock.now += 5000;
    await settleConflict(c.id, true);
    const settled = (await getSite(SITE))!;
    expect(settled.name).toBe('Fern Gully at the footbridge');
    expect(await listConflicts()).toEqual([]);
    // The settled version knows both: the office's version applied again is old news, no new conflict.
    expect((await applyIncoming([theirs])).summary).toMatchObject({ unchanged: 1, conflicts: 0 });
    expect(await listConflicts()).toEqual([]);
  });

  it('applies a revision dated a year ahead but flags it, and keeps this phone’s clock where it is', async () => {
    const ahead = officeSite(clock.now + 365 * 86_400_000, 'Fern Gully (wrong date)');
    const result = await applyIncoming([ahead]);
    expect(result.summary.ahead).toBe(1);
    expect((await getSite(SITE))?.name).toBe('Fern Gully (wrong date)');
    expect((await listConflicts(SITE)).map((c) => c.reason)).toEqual(['ahead']);
    const mine = await saveSite(site({ code: 'FG-9', name: 'Another site' }));
    expect(parseRev(mine.rev).wall_ms).toBe(clock.now);
    // An edit of the flagged site still sorts above it, or it would lose to its own starting point.
    const edited = await saveSite({ ...(await getSite(SITE))!, name: 'Fern Gully' });
    expect(edited.rev > ahead.rev).toBe(true);
  });
});

describe('the outbox', () => {
  it('waits with this phone’s records (not the demo’s), resends the same bundle until acknowledged, then empties', async () => {
    const s = await saveSite(site());
    await saveReading(reading(s.id, T0, 0.61));
    await saveSite({ ...site({ code: 'DEMO', name: 'Demo' }), id: DEMO_SITE_ID });
    await saveReading(reading(DEMO_SITE_ID, T0, 0.2));
    expect(await waitingCount()).toBe(2);
    const first = await nextOutgoing();
    expect(first?.bundle.records.map((r) => r.kind)).toEqual(['site', 'reading']);
    const again = await nextOutgoing();
    expect(again?.id).toBe(first?.id);
    // A record written while the bundle waits goes in a later bundle.
    clock.now += 1000;
    const late = await saveReading(reading(s.id, T0 + 900_000, 0.62));
    expect(await acknowledge(first!.id)).toBe(true);
    expect(await acknowledge(first!.id)).toBe(false);
    expect(await waitingCount()).toBe(1);
    const second = await nextOutgoing();
    expect(second?.bundle.records.map((r) => r.id)).toEqual([late.id]);
    await acknowledge(second!.id);
    expect(await waitingCount()).toBe(0);
    expect(await nextOutgoing()).toBeUndefined();
    expect((await getSyncValue('status'))?.lastSuccess_ms).toBe(clock.now);
  });

  it('does not count records merged from the office as waiting', async () => {
    await applyIncoming([officeSite(clock.now - 5000, 'Fern Gully')]);
    await saveSite(site());
    expect(await waitingCount()).toBe(1);
  });

  it('exports everything, or only changes since the last acknowledgement or changes file', async () => {
    await applyIncoming([officeSite(clock.now - 5000, 'Fern Gully')]);
    const s = await saveSite(site());
    const all = await exportBundle(false);
    expect(all.bundle.records.map((r) => r.id).sort()).toEqual([SITE, s.id].sort());
    const changes = await exportBundle(true);
    expect(changes.bundle.records).toEqual([toSyncRecord('site', s)]);
    await markExported(changes.through);
    expect((await exportBundle(true)).bundle.records).toEqual([]);
    // The outbox for the office is not emptied by a file: only an acknowledged push does that.
    expect(await waitingCount()).toBe(1);
  });
});

describe('upgrade to version 2', () => {
  it('has the sync and outbox stores', async () => {
    const db = await getDb();
    expect([...db.objectStoreNames]).toEqual(expect.arrayContaining(['sync', 'outbox']));
    expect(await getMeta('deviceId')).toBeUndefined();
  });
});
