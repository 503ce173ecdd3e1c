// Settling a conflict on a logger day (kind 'logger-day', store loggerDays): the settle transaction takes
// its store list from the one table of stores (web/db/stores.ts), so every synced kind can be settled.
// Before the table, loggerDays was missing from the list and settling threw NotFoundError.
import { describe, expect, it } from 'vitest';
import { formatRev, toSyncRecord, type SyncRecord } from '../../core';
import { applyIncoming, importLoggerRecord, listConflicts, saveSite, settleConflict } from '../../web/db/index';
import { listLoggerDays } from '../../web/db/logger-days';
import { useFreshDb } from '../support/db';
import { QUARTER_HOUR_MS, site, T0 } from '../support/records';

const { clock } = useFreshDb();

describe('settling a logger-day conflict', () => {
  it('keeps the chosen version of the day and removes the conflict, in one transaction', async () => {
    const s = await saveSite(site());
    const time_ms = Float64Array.from({ length: 4 }, (_, i) => T0 + i * QUARTER_HOUR_MS);
    const raw_m = Float64Array.from([0.5, 0.51, 0.52, 0.53]);
    await importLoggerRecord({ siteId: s.id, fileName: 'kc01.csv', time_ms, raw_m, correction_m: new Float64Array(4), checks: [] });
    const [mine] = await listLoggerDays(s.id, -Infinity, Infinity);
    // Another phone imported the same day (same id) with other values, not knowing this one; its revision is later.
    const theirs = toSyncRecord('logger-day', { ...mine, raw_m: [0.6, 0.61, 0.62, 0.63] as never, seen: undefined });
    const incoming = { ...theirs, rev: formatRev({ wall_ms: clock.now + 1000, counter: 0, deviceId: 'phone-2' }) } as SyncRecord;
    await applyIncoming([incoming]);
    const [c] = await listConflicts(mine.id);
    expect(c).toMatchObject({ kind: 'logger-day', reason: 'concurrent' });
    expect(Array.from((await listLoggerDays(s.id, -Infinity, Infinity))[0].raw_m)).toEqual([0.6, 0.61, 0.62, 0.63]);
    clock.now += 5000;
    await settleConflict(c.id, true);
    const [day] = await listLoggerDays(s.id, -Infinity, Infinity);
    expect(Array.from(day.raw_m)).toEqual([0.5, 0.51, 0.52, 0.53]);
    expect(day.rev > incoming.rev).toBe(true);
    expect(day.seen).toEqual([incoming.rev]);
    expect(await listConflicts()).toEqual([]);
  });
});
