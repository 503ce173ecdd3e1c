import { describe, expect, it } from 'vitest';
import { separateBaseflow, separateBaseflowDetailed, summarizeEvent } from '../../../core/hydrograph/index';
import { H, T0 } from '../../support/hydrograph-series';

const hourly = (q: readonly number[]) => ({
  time_ms: Float64Array.from(q, (_, i) => T0 + i * H),
  discharge_m3s: Float64Array.from(q),
});

describe('gaps (NaN discharge)', () => {
  it('a short gap is bridged by a straight line and the filter runs across it, saying so', () => {
    const q = Array(60).fill(8);
    q[20] = NaN;
    q[21] = NaN;
    const r = separateBaseflowDetailed(hourly(q), { kind: 'eckhardt', bfiMax: 0.5, recession: 0.9 });
    // exact: steady 8 m³/s starts and stays at the fixed point BFImax·Q = 4, across the bridged gap too
    for (const v of r.baseflow) expect(v).toBeCloseTo(4, 12);
    // DOMAIN.md §4: the note says where the gap is and that the filter ran across it
    expect(r.notes.join(' ')).toMatch(/A 3 h gap \(2 missing\) from 2024-\d\d-\d\d 19:00 UTC to .* 22:00 UTC was bridged by a straight line in discharge and Eckhardt ran across it \(gaps up to 6 h are bridged\)/);
  });

  it('a long gap splits the record: the filter restarts after it and says so', () => {
    // 10 h of 6 m³/s, a 20 h gap, then 20 h of 12 m³/s; the bridging limit of hourly data is 6 h (DOMAIN.md §4)
    const q = [...Array(10).fill(6), ...Array(19).fill(NaN), ...Array(20).fill(12)];
    const r = separateBaseflowDetailed(hourly(q), { kind: 'chapman-maxwell', recession: 0.9 });
    // exact: each piece starts at its steady state Q/2, so after the restart b = 6 at once
    expect(r.baseflow[29]).toBeCloseTo(6, 12);
    expect(r.baseflow[9]).toBeCloseTo(3, 12);
    // across the gap the baseflow is the straight line between the pieces' ends
    expect(r.baseflow[19]).toBeCloseTo(3 + (3 * 10) / 20, 12);
    expect(r.notes.join(' ')).toMatch(/A 20 h gap \(19 missing\) from .* is longer than the 6 h this record can be bridged over, so Chapman–Maxwell was restarted after it/);
    expect(r.restarts).toEqual([{ from_ms: T0 + 9 * H, to_ms: T0 + 29 * H }]);
    // a larger limit bridges the same gap instead
    const bridged = separateBaseflowDetailed(hourly(q), { kind: 'chapman-maxwell', recession: 0.9 }, { maxBridge_ms: 30 * H });
    expect(bridged.baseflow[29]).toBeLessThan(6);
    expect(bridged.notes.join(' ')).toMatch(/bridged/);
  });

  it('gaps at the ends are held level; summaries bridge gaps too', () => {
    const q = [NaN, NaN, 5, 5, 5, 5, NaN];
    const s = hourly(q);
    const r = separateBaseflowDetailed(s, { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 });
    for (const v of r.baseflow) expect(v).toBeCloseTo(4, 12);
    expect(r.notes.join(' ')).toMatch(/held level/);
    const sum = summarizeEvent(s, r.baseflow);
    expect(sum.totalVolume_m3).toBeCloseTo(5 * 6 * 3600, 6); // exact: 5 m³/s over 6 h
    expect(sum.notes.join(' ')).toMatch(/held at the (first|last) available discharge/);
  });
});

describe('resampling irregular readings for the filters', () => {
  it('says so, and steady flow still gives exactly BFImax·Q at every reading', () => {
    const hours = [0, 0.5, 1.7, 2, 3.1, 5, 5.2, 7, 9.4, 10, 12, 13, 15.5, 16];
    const s = { time_ms: Float64Array.from(hours, (h) => T0 + h * H), discharge_m3s: Float64Array.from(hours, () => 3) };
    const r = separateBaseflowDetailed(s, { kind: 'eckhardt', bfiMax: 0.25, recession: 0.95 });
    for (const v of r.baseflow) expect(v).toBeCloseTo(0.75, 12); // exact: Eckhardt 2005 fixed point B·Q
    expect(r.notes.join(' ')).toMatch(/irregular: 14 readings were resampled/);
    expect(r.baseflow.length).toBe(hours.length);
  });

  it('does not resample regular data (the notes are the per-day α at the hourly step and that it is daily-only)', () => {
    // α is per day since the constants became per day: 0.925^(1/24) = 0.996757… per hour
    const r = separateBaseflowDetailed(hourly([3, 4, 9, 7, 5, 4, 3.5, 3.2]), { kind: 'lyne-hollick' });
    expect(r.notes).toEqual([
      'Lyne–Hollick α 0.925 per day applied as 0.996757 per 1-h step.',
      "Lyne–Hollick's α is set for daily flows and has no established conversion to a 1-h step; on this record its baseflow is indicative only.",
    ]);
    expect(r.dailyOnly).toMatch(/daily flows/);
  });

  it('resampled baseflow is capped at the readings', () => {
    const hours = [0, 1, 1.5, 4, 4.2, 8, 9, 13, 14, 20];
    const q = [2, 2, 9, 30, 28, 10, 7, 4, 3.5, 3];
    const s = { time_ms: Float64Array.from(hours, (h) => T0 + h * H), discharge_m3s: Float64Array.from(q) };
    for (const method of [{ kind: 'lyne-hollick' }, { kind: 'chapman-maxwell', recession: 0.925 }] as const) {
      const b = separateBaseflow(s, method);
      for (let i = 0; i < q.length; i++) {
        expect(b[i]).toBeGreaterThanOrEqual(0);
        expect(b[i]).toBeLessThanOrEqual(q[i]);
      }
    }
  });
});
