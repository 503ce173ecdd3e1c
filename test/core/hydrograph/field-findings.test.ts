// Each finding of issue 12 on ordinary field records, reproduced on an invented record with a known answer.
import { describe, expect, it } from 'vitest';
import {
  findEventPoints,
  findEventPointsDetailed,
  localMinimumInterval_days,
  separateBaseflow,
  separateBaseflowDetailed,
  summarizeEvent,
  type EventPoints,
  type Series,
} from '../../../core/hydrograph/index';
import { dischargeOf, loggerRecord, ORIGIN_MS, singleStorm, stageOf } from '../../support/logger-records';

const H = 3_600_000;
const DAY = 86_400_000;
const T0 = Date.UTC(2025, 5, 1);
const hourly = (q: number[]): Series => ({ time_ms: Float64Array.from(q, (_, i) => T0 + i * H), discharge_m3s: Float64Array.from(q) });

/** Trapezoid integral (m³) of y (m³/s) over times (ms): the test's own oracle. */
function trapezoid(t: ArrayLike<number>, y: ArrayLike<number>): number {
  let v = 0;
  for (let i = 1; i < t.length; i++) v += ((y[i] + y[i - 1]) / 2) * ((t[i] - t[i - 1]) / 1000);
  return v;
}

/** A triangle of `rise` m³/s on a flat base, hourly: up from rise_h to peak_h, down to end_h. */
function triangle(base: number, rise: number, rise_h: number, peak_h: number, end_h: number, span_h: number): number[] {
  const q: number[] = [];
  for (let h = 0; h <= span_h; h++) {
    let v = 0;
    if (h > rise_h && h <= peak_h) v = (rise * (h - rise_h)) / (peak_h - rise_h);
    else if (h > peak_h && h < end_h) v = (rise * (end_h - h)) / (end_h - peak_h);
    q.push(base + v);
  }
  return q;
}

describe('1. the rise start walks over a wobble on the rising limb', () => {
  // Invented: base 2 m³/s, a 10 m³/s triangle from 10 h to a peak at 20 h, down by 30 h; at 15 h one reading
  // dips 1.15 m³/s below the line (0.15 m³/s below the reading before it), more than 1 % of the rise.
  const q = triangle(2, 10, 10, 20, 30, 72);
  q[15] = q[14] - 0.15;
  it('the rise start is the foot of the rise, and the direct volume is the whole storm', () => {
    const p = findEventPoints(hourly(q), { area_km2: 5 });
    expect(p.riseStart_ms).toBe(T0 + 10 * H);
    const s = hourly(q);
    const b = separateBaseflow(s, { kind: 'straight-line' }, { points: p });
    const sum = summarizeEvent(s, b, { from_ms: p.riseStart_ms, to_ms: p.runoffEnd_ms });
    // exact: the baseflow is the flat 2 m³/s base, so direct runoff is the trapezoid of Q − 2 over the record
    expect(sum.directVolume_m3).toBeCloseTo(trapezoid(s.time_ms, q.map((v) => v - 2)), 3);
  });
  it('a wobble on the falling limb, far above the pre-event level, does not end the falling limb', () => {
    // Invented: the same triangle without the dip; at 24 h the fall pauses with a 0.7 m³/s re-rise (7 % of the
    // rise, from a dip 7.5 m³/s above the base): the semi-log end of runoff must lie past it, at the foot (30 h).
    const r = triangle(2, 10, 10, 20, 30, 72);
    r[25] = r[24] + 0.7;
    const p = findEventPoints(hourly(r));
    expect(p.runoffEnd_ms).toBeGreaterThanOrEqual(T0 + 29 * H);
  });
});

describe('2. two bursts: the rise start is before the first rise', () => {
  // Invented: a 6 m³/s burst rising 10–16 h, falling to 4 m³/s above base at 20 h, then a 10 m³/s burst to a
  // peak at 26 h and down to base at 40 h; the dip (4 above base) is 40 % of the rise: one storm, two bursts.
  const q: number[] = [];
  for (let h = 0; h <= 96; h++) {
    let v = 0;
    if (h > 10 && h <= 16) v = h - 10;
    else if (h > 16 && h <= 20) v = 6 - 0.5 * (h - 16);
    else if (h > 20 && h <= 26) v = 4 + 1 * (h - 20);
    else if (h > 26 && h < 40) v = (10 * (40 - h)) / 14;
    q.push(1.5 + v);
  }
  it('starts at 10 h, says two bursts, and keeps the whole volume', () => {
    const r = findEventPointsDetailed(hourly(q), { area_km2: 3 });
    expect(r.points.riseStart_ms).toBe(T0 + 10 * H);
    expect(r.points.peak_ms).toBe(T0 + 26 * H);
    expect(r.notes.join(' ')).toMatch(/came in 2 bursts/);
  });
  it('bursts after the highest peak: the end of runoff is counted from the last burst', () => {
    // mirrored in time: the highest burst first (peak at 70 h), the smaller one peaking 10 h later is the last
    const m = [...[...q].reverse(), ...Array<number>(40).fill(1.5)]; // 40 h more of base flow at the end
    const r = findEventPointsDetailed(hourly(m), { area_km2: 3 });
    const n = 0.827 * Math.pow(3, 0.2); // Linsley, Kohler & Paulhus: N = 0.827·A^0.2 days
    expect(r.points.peak_ms).toBe(T0 + 70 * H);
    expect(r.points.runoffEnd_ms).toBe(Math.round(T0 + 80 * H + n * DAY));
    expect(r.notes.join(' ')).toMatch(/counted from the last burst's peak, 10 h after the highest reading/);
  });
});

describe('3. recession fits span a duration, not 5 readings', () => {
  // Invented 5-minute record: pre-event recession 3·e^(−t/2 days), a triangle of 12 m³/s from 24 h to a peak at
  // 30 h and back by 48 h, post-event recession continuing the same exponential. Two readings just after the end
  // of runoff (48 h) are off by +1 % and −1 %: the variable-slope volume must barely move.
  const step = 5 * 60_000;
  const count = 4 * 288 + 1;
  const time_ms = Float64Array.from({ length: count }, (_, i) => T0 + i * step);
  const clean = Float64Array.from({ length: count }, (_, i) => {
    const h = (i * step) / H;
    const tri = h > 24 && h <= 30 ? 2 * (h - 24) : h > 30 && h < 48 ? (12 * (48 - h)) / 18 : 0;
    return 3 * Math.exp(-h / 48) + tri;
  });
  const points: EventPoints = { riseStart_ms: T0 + 24 * H, peak_ms: T0 + 30 * H, inflection_ms: T0 + 36 * H, runoffEnd_ms: T0 + 48 * H };
  const depth = (q: Float64Array) => {
    const s = { time_ms, discharge_m3s: q };
    return summarizeEvent(s, separateBaseflow(s, { kind: 'variable-slope' }, { points }), { from_ms: points.riseStart_ms, to_ms: points.runoffEnd_ms, area_km2: 20 })
      .runoffDepth_mm as number;
  };
  it('two readings off by ±1 % near the end of runoff move the depth by less than 1 %', () => {
    const off = Float64Array.from(clean);
    off[48 * 12 + 2] *= 1.01;
    off[48 * 12 + 4] *= 0.99;
    expect(Math.abs(depth(off) / depth(clean) - 1)).toBeLessThan(0.01);
  });
  it('the rise start itself is left out of the pre-event fit', () => {
    // the reading at the rise start is 3 % low (a trough): the pre-event slope must still be exactly 1/(48 h)
    const dipped = Float64Array.from(clean);
    dipped[24 * 12] *= 0.97;
    const s = { time_ms, discharge_m3s: dipped };
    const b = separateBaseflow(s, { kind: 'concave' }, { points });
    // exact: concave baseflow under the peak = Q(A)·e^(−6 h / 48 h) with the slope of the untouched recession
    expect(b[30 * 12]).toBeCloseTo(dipped[24 * 12] * Math.exp(-6 / 48), 9);
  });
});

describe('4. missing values and logger outages', () => {
  const q = triangle(2, 10, 10, 20, 30, 60);
  const t = q.map((_, i) => T0 + i * H);
  it('null and undefined are gaps, bridged with a note, never 0 m³/s', () => {
    const withNull: (number | null | undefined)[] = [...q];
    withNull[5] = null;
    withNull[6] = undefined;
    const r = findEventPointsDetailed({ time_ms: t, discharge_m3s: withNull as number[] });
    expect(r.notes.join(' ')).toMatch(/2 missing discharges \(readings 5–6\) were bridged by a straight line over 3\.00 h/);
    expect(r.points.riseStart_ms).toBe(T0 + 10 * H); // a 0 m³/s reading would have become the pre-event level
    const sum = summarizeEvent({ time_ms: t, discharge_m3s: withNull as number[] }, q);
    expect(sum.totalVolume_m3).toBeCloseTo(trapezoid(t, q), 6); // exact: the bridged values are the line itself
  });
  it('strings and booleans are refused with a RangeError naming the index', () => {
    for (const [bad, shown] of [['2.5', /discharge_m3s\[7\] is the text "2.5"/], [true, /discharge_m3s\[7\] is boolean true/]] as const) {
      const values: unknown[] = [...q];
      values[7] = bad;
      const call = () => findEventPoints({ time_ms: t, discharge_m3s: values as number[] });
      expect(call).toThrow(RangeError);
      expect(call).toThrow(shown);
      expect(() => separateBaseflow({ time_ms: t, discharge_m3s: values as number[] }, { kind: 'lyne-hollick' })).toThrow(shown);
    }
  });
  it('a logger outage of hours is said with its length', () => {
    // every 15 minutes for three days, with no readings from 06:00 to 11:30 on the first day (5.5 h)
    const times: number[] = [];
    const flows: number[] = [];
    for (let m = 0; m <= 3 * 24 * 60; m += 15) {
      if (m > 6 * 60 && m < 11.5 * 60) continue;
      times.push(T0 + m * 60_000);
      flows.push(2 + 10 * Math.exp(-(((m / 60 - 30) / 4) ** 2)));
    }
    const r = findEventPointsDetailed({ time_ms: times, discharge_m3s: flows });
    expect(r.notes.join(' ')).toMatch(/no readings for 5\.5 h after 2025-06-01 06:00 UTC/);
  });
});

describe('5. peak + N runs into the next storm', () => {
  // Invented: a storm peaking at 14 h, back to base by 30 h, and a second one rising at 40 h; N for 500 km² is
  // 0.827·500^0.2 = 2.86 days, far past the next rise.
  const q = triangle(2, 10, 10, 14, 30, 96).map((v, h) => v + (h > 40 && h <= 46 ? h - 40 : h > 46 && h < 60 ? (6 * (60 - h)) / 14 : 0));
  it('the end of runoff is the start of the next storm, and a note says so', () => {
    const r = findEventPointsDetailed(hourly(q), { area_km2: 500 });
    expect(r.points.runoffEnd_ms).toBeGreaterThanOrEqual(T0 + 30 * H);
    expect(r.points.runoffEnd_ms).toBeLessThanOrEqual(T0 + 40 * H);
    expect(r.notes.join(' ')).toMatch(/runs into the next storm/);
  });
});

describe('6. no storm, and storms cut by the ends of the record', () => {
  it('a flat record with logger noise is refused, giving both numbers', () => {
    const model = { ...singleStorm(7, 15), bursts: [] };
    const s = loggerRecord(model, 7);
    const call = () => findEventPoints(s);
    expect(call).toThrow(RangeError);
    expect(call).toThrow(/No storm was found.*stands [0-9.]+ m³\/s above.*σ = [0-9.e-]+ m³\/s/);
  });
  it('a storm already rising at the first reading gets a note', () => {
    const q = triangle(2, 10, -2, 8, 20, 48);
    const r = findEventPointsDetailed(hourly(q));
    expect(r.points.riseStart_ms).toBe(T0);
    expect(r.notes.join(' ')).toMatch(/starts on the rising limb/);
  });
  it('a storm whose recession is not recorded gets a note', () => {
    const q = triangle(2, 10, 10, 20, 60, 30);
    const r = findEventPointsDetailed(hourly(q));
    expect(r.notes.join(' ')).toMatch(/ends before the storm has receded: the last readings are still/);
  });
});

describe('7. noise and the recursive filters', () => {
  // A simulated 5-minute logger record with 3 mm of stage noise (test/support/logger-records.ts)
  const model = { ...singleStorm(11, 5), stageNoise_m: 0.003 };
  const noisy = loggerRecord(model, 11);
  const clean = loggerRecord({ ...model, stageNoise_m: 0, resolution_m: 0 }, 11);
  const bfi = (s: Series, b: ArrayLike<number>) => summarizeEvent(s, b).baseflowIndex;
  it('says when the noise is large for the step, and not on the noise-free record', () => {
    const r = separateBaseflowDetailed(noisy, { kind: 'lyne-hollick' });
    expect(r.notes.join(' ')).toMatch(/noise .* is large for its step/);
    expect(separateBaseflowDetailed(clean, { kind: 'lyne-hollick' }).notes.join(' ')).not.toMatch(/large for its step/);
  });
  it('light smoothing brings the baseflow index closer to the noise-free one and states its effect', () => {
    const truth = bfi(clean, separateBaseflow(clean, { kind: 'lyne-hollick' }));
    const raw = bfi(noisy, separateBaseflow(noisy, { kind: 'lyne-hollick' }));
    const r = separateBaseflowDetailed(noisy, { kind: 'lyne-hollick' }, { smoothing: 'light' });
    const smoothed = bfi(noisy, r.baseflow);
    expect(raw).toBeLessThan(truth); // the finding: noise turned into quickflow
    expect(Math.abs(smoothed - truth)).toBeLessThan(Math.abs(raw - truth));
    expect(r.notes.join(' ')).toMatch(/mean of 5 readings centred on it \(20 min\).*from 0\.\d{3} without smoothing to 0\.\d{3} with it/);
    for (let i = 0; i < r.baseflow.length; i++) expect(r.baseflow[i]).toBeLessThanOrEqual(noisy.discharge_m3s[i]);
  });
  it('hourly readings are too far apart to smooth lightly, and it says so', () => {
    const r = separateBaseflowDetailed(hourly(triangle(2, 10, 10, 20, 30, 72)), { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 }, { smoothing: 'light' });
    expect(r.notes.join(' ')).toMatch(/not applied: the readings are 1 h apart/);
  });
});

describe('8. small ones', () => {
  it('the trapezoid takes the end of runoff as a node when it falls between daily readings', () => {
    // Invented daily flows; straight line from the rise start (day 2, 2 m³/s) to the end of runoff at day 6.5
    // (Q = 3.5 m³/s, halfway between 4 and 3). Exact: ∫(Q − b) over days 2–6.5 with Q and b piecewise linear.
    const q = [2, 2, 2, 10, 8, 6, 4, 3, 2.5, 2.2, 2, 2];
    const s = { time_ms: q.map((_, d) => T0 + d * DAY), discharge_m3s: q };
    const points: EventPoints = { riseStart_ms: T0 + 2 * DAY, peak_ms: T0 + 3 * DAY, inflection_ms: T0 + 4 * DAY, runoffEnd_ms: T0 + 6.5 * DAY };
    const r = separateBaseflowDetailed(s, { kind: 'straight-line' }, { points });
    const sum = summarizeEvent(s, r.baseflow, { from_ms: points.riseStart_ms, to_ms: points.runoffEnd_ms, baseflowAtPoints: r.baseflowAtPoints });
    const line = (d: number) => 2 + (1.5 * (d - 2)) / 4.5;
    const nodes = [2, 3, 4, 5, 6, 6.5];
    const qAt = (d: number) => (d === 6.5 ? 3.5 : q[d]);
    let exact = 0;
    for (let k = 1; k < nodes.length; k++) {
      const [a, b] = [nodes[k - 1], nodes[k]];
      exact += (((qAt(a) - line(a)) + (qAt(b) - line(b))) / 2) * (b - a) * 86_400;
    }
    expect(sum.directVolume_m3).toBeCloseTo(exact, 3);
  });
  it('a window that starts and ends at the same time does not say "no flow"', () => {
    const s = hourly([2, 2, 2, 2]);
    const sum = summarizeEvent(s, [2, 2, 2, 2], { from_ms: T0 + H, to_ms: T0 + H });
    expect(sum.notes.join(' ')).toMatch(/starts and ends at the same time/);
    expect(sum.notes.join(' ')).not.toMatch(/no flow/);
  });
  it('localMinimumInterval_days names itself for a bad area', () => {
    expect(() => localMinimumInterval_days(-5)).toThrow(/^localMinimumInterval_days needs a catchment area above 0 km²; got -5/);
  });
  it('the simulated rating is the power law both ways (a check of the test support itself)', () => {
    expect(dischargeOf(stageOf(5))).toBeCloseTo(5, 12);
    expect(ORIGIN_MS).toBe(Date.UTC(2025, 4, 1));
  });
});

describe('notes are plain sentences for the storm screen', () => {
  it('no internal names, no raw milliseconds, each a sentence', () => {
    const model = { ...singleStorm(3, 5), stageNoise_m: 0.003 };
    const noisy = loggerRecord(model, 3);
    const gappy = { time_ms: Array.from(noisy.time_ms), discharge_m3s: Array.from(noisy.discharge_m3s) as (number | null)[] };
    gappy.discharge_m3s[100] = null;
    gappy.time_ms.splice(400, 60);
    gappy.discharge_m3s.splice(400, 60);
    const series = gappy as { time_ms: number[]; discharge_m3s: number[] };
    const notes = [
      ...findEventPointsDetailed(series, { area_km2: 50 }).notes,
      ...findEventPointsDetailed(series).notes,
      ...separateBaseflowDetailed(series, { kind: 'variable-slope' }, { area_km2: 50 }).notes,
      ...separateBaseflowDetailed(series, { kind: 'lyne-hollick' }, { smoothing: 'light' }).notes,
      ...separateBaseflowDetailed(noisy, { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 }).notes,
    ];
    expect(notes.length).toBeGreaterThan(8);
    for (const note of notes) {
      expect(note).toMatch(/^[A-Z0-9].*[.)]$/);
      expect(note).not.toMatch(/_ms|_m3s|_km2|[a-z][A-Z][a-z]+[A-Z(]|\b\d{10,}\b|NaN|undefined|Infinity/);
    }
  });
});
