// The readings list built from the stage record: spot readings one row each, a logger day one row with its
// count, ranges and corrections. Exact hand-made cases (counts and extremes by inspection).
import { describe, expect, it } from 'vitest';
import { splitLoggerDays, stageRecordWithDischarge } from '../../core';
import { listItems } from '../../web/screens/SiteReadings/list-items';
import { reading, T0, QUARTER_HOUR_MS as Q } from '../support/records';

const DAY = 86_400_000;

describe('the readings list of a stage record', () => {
  it('collapses each logger day to one row, newest first, with spot readings between', () => {
    const times = Array.from({ length: 192 }, (_, i) => T0 + i * Q); // two whole UTC days
    const days = splitLoggerDays({ time_ms: times, raw_m: times.map((_, i) => 0.5 + i / 1000), correction_m: times.map((_, i) => (i < 96 ? 0.01 : 0.02)) }, { siteId: 's1', fileName: 'kc01.csv', checks: [] });
    const spot = { ...reading('s1', T0 + 2 * DAY + Q, 0.9), id: 'r1', rev: 'x', updated_ms: 0 };
    const items = listItems(stageRecordWithDischarge([], [spot], days));
    expect(items.map((i) => i.kind)).toEqual(['reading', 'logger-day', 'logger-day']);
    const [, second, first] = items;
    if (second.kind !== 'logger-day' || first.kind !== 'logger-day') throw new Error('expected logger days');
    expect([first.count, second.count]).toEqual([96, 96]);
    expect(first.first_ms).toBe(T0);
    expect(first.last_ms).toBe(T0 + 95 * Q);
    expect(second.minStage_m).toBeCloseTo(0.5 + 96 / 1000 + 0.02, 12);
    expect(second.maxStage_m).toBeCloseTo(0.5 + 191 / 1000 + 0.02, 12);
    expect([first.minCorrection_m, first.maxCorrection_m]).toEqual([0.01, 0.01]);
    expect(Number.isNaN(first.maxDischarge_m3s)).toBe(true); // no rating: no discharge
  });
});
