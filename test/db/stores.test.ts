// Every store's API on fake-indexeddb: save/get/list/delete/restore, the index queries, tombstones,
// the current rating, discharges of a window, latest reading per site, change notifications.
import { describe, expect, it } from 'vitest';
import { compareRev, parseRev, RecordValidationError } from '../../core/records/index';
import { ratingInForceAt, deleteRating, deleteReading, deleteSite, discardDraft, getReading, getSite, latestReadings, readingBefore, listAnalyses, listConflicts, listDrafts, listGaugings, listRatings, listReadings, listSites, onRecordsChanged, readingsWithDischarge, restoreReading, saveAnalysis, saveDraft, saveGauging, saveRating, saveReading, saveSite, storageState } from '../../web/db/index';
import { deviceId, observeRev } from '../../web/db/clock';
import { dismissConflict, saveConflict } from '../../web/db/conflicts';
import { getDraft } from '../../web/db/drafts';
import { getGauging } from '../../web/db/gaugings';
import { getMeta } from '../../web/db/meta';
import { restoreSite } from '../../web/db/sites';
import { changedSince } from '../../web/db/records';
import { type RecordsChange } from '../../web/db/events';
import { useFreshDb } from '../support/db';
import { gauging, rating, reading, site, T0 } from '../support/records';

const { clock } = useFreshDb();
const HOUR = 3_600_000;

describe('sites and readings', () => {
  it('saves a site with a new UUID, a revision and updated_ms, and reads it back', async () => {
    const s = await saveSite(site());
    // RFC 9562 UUID layout.
    expect(s.id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/);
    expect(s.updated_ms).toBe(clock.now);
    expect(parseRev(s.rev).wall_ms).toBe(clock.now);
    expect(parseRev(s.rev).deviceId).toBe(await deviceId());
    expect(await getSite(s.id)).toEqual(s);
  });

  it('keeps the id and raises the revision when a record is saved again', async () => {
    const s = await saveSite(site());
    const again = await saveSite({ ...s, name: 'Kettle Creek at the footbridge' });
    expect(again.id).toBe(s.id);
    expect(compareRev(again.rev, s.rev)).toBe(1);
    expect((await listSites()).map((x) => x.name)).toEqual(['Kettle Creek at the footbridge']);
  });

  it('lists readings of one site inside a time window in time order, using the [siteId, time_ms] index', async () => {
    const a = await saveSite(site());
    const b = await saveSite(site({ code: 'KC-02', name: 'Kettle Creek at Upper Road' }));
    for (const h of [3, 1, 2, 5]) await saveReading(reading(a.id, T0 + h * HOUR, 0.5 + h / 100));
    await saveReading(reading(b.id, T0 + 2 * HOUR, 9));
    const window = await listReadings(a.id, T0 + HOUR, T0 + 3 * HOUR);
    // exact: hours 1, 2, 3 of site a (bounds inclusive), not hour 5, not site b.
    expect(window.map((r) => r.time_ms)).toEqual([T0 + HOUR, T0 + 2 * HOUR, T0 + 3 * HOUR]);
    expect(window.map((r) => r.stage_m)).toEqual([0.51, 0.52, 0.53]);
  });

  it('deletes by tombstone (hidden from lists, kept for sync) and restores under a newer revision', async () => {
    const s = await saveSite(site());
    const r = await saveReading(reading(s.id, T0, 0.61));
    clock.now += 1000;
    const tomb = await deleteReading(r.id);
    expect(tomb?.deleted).toBe(true);
    expect(compareRev(tomb!.rev, r.rev)).toBe(1);
    expect(await getReading(r.id)).toBeUndefined();
    expect(await listReadings(s.id, T0, T0)).toEqual([]);
    expect((await getReading(r.id, { includeDeleted: true }))?.stage_m).toBe(0.61);
    expect((await changedSince('readings', r.rev)).map((x) => x.id)).toEqual([r.id]);
    expect(await deleteReading(r.id)).toBeUndefined();
    const back = await restoreReading(r.id);
    expect(back && 'deleted' in back).toBe(false);
    expect(compareRev(back!.rev, tomb!.rev)).toBe(1);
    expect((await listReadings(s.id, T0, T0)).map((x) => x.id)).toEqual([r.id]);
    await deleteSite(s.id);
    expect(await listSites()).toEqual([]);
    await restoreSite(s.id);
    expect((await listSites()).length).toBe(1);
  });

  it('refuses an invalid reading naming the field and writes nothing', async () => {
    const s = await saveSite(site());
    await expect(saveReading(reading(s.id, T0, Number.NaN))).rejects.toMatchObject({ name: 'RecordValidationError', field: 'stage_m' });
    await expect(saveReading({ ...reading(s.id, T0, 1), id: 'abc' })).rejects.toBeInstanceOf(RecordValidationError);
    expect(await listReadings(s.id, -Infinity, Infinity)).toEqual([]);
  });

  it('gives the latest non-deleted reading per site', async () => {
    const a = await saveSite(site());
    const b = await saveSite(site({ code: 'KC-02' }));
    await saveReading(reading(a.id, T0, 0.4));
    const last = await saveReading(reading(a.id, T0 + HOUR, 0.45));
    const newest = await saveReading(reading(a.id, T0 + 2 * HOUR, 0.47));
    await deleteReading(newest.id);
    const latest = await latestReadings([a.id, b.id]);
    expect(latest.get(a.id)?.id).toBe(last.id);
    expect(latest.has(b.id)).toBe(false);
  });

  it('gives the reading just before a time, skipping tombstones, the reading being edited and other sites', async () => {
    const a = await saveSite(site());
    const b = await saveSite(site({ code: 'KC-02' }));
    const first = await saveReading(reading(a.id, T0, 0.4));
    const second = await saveReading(reading(a.id, T0 + HOUR, 0.45));
    const deleted = await saveReading(reading(a.id, T0 + 2 * HOUR, 0.5));
    await deleteReading(deleted.id);
    const at = await saveReading(reading(a.id, T0 + 3 * HOUR, 0.6));
    await saveReading(reading(b.id, T0 + 2.5 * HOUR, 9));
    expect((await readingBefore(a.id, T0 + 3 * HOUR))?.id).toBe(second.id); // strictly before: not `at` itself
    expect((await readingBefore(a.id, T0 + 4 * HOUR))?.id).toBe(at.id);
    expect((await readingBefore(a.id, T0 + 4 * HOUR, at.id))?.id).toBe(second.id);
    expect((await readingBefore(a.id, T0 + HOUR))?.id).toBe(first.id);
    expect(await readingBefore(a.id, T0)).toBeUndefined();
  });
});

describe('gaugings, ratings, analyses', () => {
  it('lists gaugings of a site by time', async () => {
    const s = await saveSite(site());
    const g2 = await saveGauging(gauging(s.id, T0 + 2 * HOUR, { verticals: [{ station_m: 0.5, depth_m: 0.3, velocity_mps: 0.4 }] }));
    const g1 = await saveGauging(gauging(s.id, T0 + HOUR));
    expect((await listGaugings(s.id)).map((g) => g.id)).toEqual([g1.id, g2.id]);
    expect((await getGauging(g2.id))?.verticals).toEqual([{ station_m: 0.5, depth_m: 0.3, velocity_mps: 0.4 }]);
  });

  it('finds the rating in force: the latest validFrom at or before the time that is not deleted', async () => {
    const s = await saveSite(site());
    const r1 = await saveRating(rating(s.id, T0));
    const r2 = await saveRating(rating(s.id, T0 + 10 * HOUR));
    const r3 = await saveRating(rating(s.id, T0 + 20 * HOUR));
    await saveRating(rating((await saveSite(site({ code: 'KC-02' }))).id, T0 + 5 * HOUR));
    expect(await ratingInForceAt(s.id, T0 - 1)).toBeUndefined();
    expect((await ratingInForceAt(s.id, T0))?.id).toBe(r1.id);
    expect((await ratingInForceAt(s.id, T0 + 10 * HOUR - 1))?.id).toBe(r1.id);
    expect((await ratingInForceAt(s.id, T0 + 15 * HOUR))?.id).toBe(r2.id);
    expect((await ratingInForceAt(s.id, T0 + 99 * HOUR))?.id).toBe(r3.id);
    await deleteRating(r3.id);
    expect((await ratingInForceAt(s.id, T0 + 99 * HOUR))?.id).toBe(r2.id);
    expect((await listRatings(s.id)).map((r) => r.id)).toEqual([r1.id, r2.id]);
  });

  it('gives each reading of a window its discharge through the rating and shift in force at its time', async () => {
    const s = await saveSite(site());
    await saveRating(rating(s.id, T0));
    const shifted = await saveRating(rating(s.id, T0 + 2 * HOUR, {
      shifts: [{ time_ms: T0 + 2 * HOUR, toNext: 'hold', curve: { points: [{ stage_m: 0, shift_m: 0.1 }] } }],
    }));
    await saveReading(reading(s.id, T0 - HOUR, 0.7));
    await saveReading(reading(s.id, T0 + HOUR, 0.7));
    await saveReading(reading(s.id, T0 + 3 * HOUR, 0.7));
    await saveReading(reading(s.id, T0 + 4 * HOUR, 1.9));
    await saveReading(reading(s.id, T0 + 5 * HOUR, 0.1));
    const rows = await readingsWithDischarge(s.id, T0 - HOUR, T0 + 5 * HOUR);
    // exact: Q = 10·(h + s − 0.2)² (power-law rating, ISO 18320 form).
    expect(rows[0].ratingId).toBeUndefined();
    expect(rows[0].discharge_m3s).toBeNaN(); // no rating in force: NO_DISCHARGE
    expect(rows[1].discharge_m3s).toBeCloseTo(10 * 0.5 ** 2, 12);
    expect(rows[2]).toMatchObject({ ratingId: shifted.id, shift_m: 0.1, extrapolated: false });
    expect(rows[2].discharge_m3s).toBeCloseTo(10 * 0.6 ** 2, 12);
    expect(rows[3].extrapolated).toBe(true); // 1.9 m is above the gauged 1.5 m
    expect(rows[3].discharge_m3s).toBeCloseTo(10 * 1.8 ** 2, 12);
    expect(rows[4].discharge_m3s).toBe(0); // exact: 0.1 + 0.1 m is at the 0.2 m offset: no flow
    expect(rows[4].extrapolated).toBe(false); // no flow is not an extrapolation, though 0.1 m is below the gauged 0.3 m
  });

  it('lists analyses of a site', async () => {
    const s = await saveSite(site());
    const a = await saveAnalysis({
      siteId: s.id, from_ms: T0, to_ms: T0 + 48 * HOUR, method: { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 },
      points: { riseStart_ms: T0 + HOUR, peak_ms: T0 + 6 * HOUR, inflection_ms: T0 + 12 * HOUR, runoffEnd_ms: T0 + 40 * HOUR },
      area_km2: 48.2, rainfall_mm: 38,
      results: { peak_m3s: 12.5, peakTime_ms: T0 + 6 * HOUR, totalVolume_m3: 5e5, baseflowVolume_m3: 2e5, directVolume_m3: 3e5, baseflowIndex: 0.4 },
      note: '',
    });
    expect(await listAnalyses(s.id)).toEqual([a]);
  });
});

describe('drafts, conflicts, meta, clock', () => {
  it('keeps drafts per form and removes them when discarded', async () => {
    const d = await saveDraft({ form: 'reading', siteId: 'site-1', fields: { stage: '0.73', note: 'weed on control' } });
    await saveDraft({ form: 'gauging', fields: { verticals: [[0.5, 0.3, 0.4]] } });
    expect((await listDrafts('reading')).map((x) => x.id)).toEqual([d.id]);
    expect(await listDrafts('reading', 'other-site')).toEqual([]);
    await discardDraft(d.id);
    expect(await getDraft(d.id)).toBeUndefined();
  });

  it('keeps a losing version as a conflict for review', async () => {
    const s = await saveSite(site());
    const losing = { kind: 'site' as const, id: s.id, rev: '1767225600000-000000-other', body: { ...site({ name: 'Old name' }), updated_ms: 1 } };
    const c = await saveConflict({ kind: 'site', recordId: s.id, losing, winnerRev: s.rev, found_ms: clock.now });
    expect((await listConflicts(s.id)).map((x) => (x.losing.kind === 'site' ? x.losing.body.name : x.losing.kind))).toEqual(['Old name']);
    await dismissConflict(c.id);
    expect(await listConflicts()).toEqual([]);
  });

  it('keeps one device id', async () => {
    const id = await deviceId();
    await saveSite(site());
    expect(await deviceId()).toBe(id);
    expect(await getMeta('deviceId')).toBe(id);
  });

  it('issues revisions above a remote revision it has seen, even with a slow clock', async () => {
    // HLC receive rule (Kulkarni 2014): after observing a remote revision, local ones sort above it.
    const remote = '2000000000000-000007-office';
    await observeRev(remote);
    const s = await saveSite(site());
    expect(compareRev(s.rev, remote)).toBe(1);
    expect(parseRev(s.rev).wall_ms).toBe(2_000_000_000_000);
  });

  it('tells listeners in this tab and other tabs what changed', async () => {
    const seen: RecordsChange[] = [];
    onRecordsChanged((c) => seen.push(c));
    const other = new BroadcastChannel('freshet-records');
    const fromOther = new Promise<unknown>((resolve) => (other.onmessage = (e) => resolve(e.data)));
    const s = await saveSite(site());
    expect(seen).toEqual([{ kinds: ['site'], ids: [s.id], fromOtherTab: false }]);
    expect(await fromOther).toEqual({ kinds: ['site'], ids: [s.id] });
    other.postMessage({ kinds: ['reading'], ids: ['x'] });
    await new Promise((r) => setTimeout(r, 20));
    expect(seen.at(-1)).toEqual({ kinds: ['reading'], ids: ['x'], fromOtherTab: true });
    other.close();
  });

  it('reports storage persistence as unsupported where there is no Storage API', async () => {
    // Node 20 has no navigator.storage: the answer must say so rather than guess.
    expect(await storageState()).toEqual({ persisted: 'unsupported' });
  });
});
