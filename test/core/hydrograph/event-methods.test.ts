import { describe, expect, it } from 'vitest';
import { separateBaseflow, separateBaseflowDetailed, summarizeEvent, type EventPoints } from '../../../core/hydrograph/index';
import { H, T0, trapezoid, triangleSeries } from '../../support/hydrograph-series';

const points = (rise: number, peak: number, inflection: number, end: number): EventPoints => ({
  riseStart_ms: T0 + rise * H,
  peak_ms: T0 + peak * H,
  inflection_ms: T0 + inflection * H,
  runoffEnd_ms: T0 + end * H,
});

describe('event methods on a triangle over a flat base: direct runoff is exactly the triangle', () => {
  // exact: a triangle of height 10 m³/s and base 20 h holds ½·10·20·3600 = 360 000 m³; with every reading
  // before the rise at 2 m³/s (flat extension) each method's baseflow is the 2 m³/s base.
  const s = triangleSeries(() => 2, 10, 10, 14, 30, 0.5, 60);
  const p = points(10, 14, 22, 30);
  for (const kind of ['constant-discharge', 'straight-line', 'concave', 'variable-slope'] as const) {
    it(kind, () => {
      const b = separateBaseflow(s, { kind }, { points: p });
      const sum = summarizeEvent(s, b);
      expect(sum.directVolume_m3).toBeCloseTo(360_000, 4);
      expect(sum.totalVolume_m3).toBeCloseTo(2 * 60 * 3600 + 360_000, 4);
      for (let i = 0; i < b.length; i++) expect(b[i]).toBeCloseTo(2, 12);
    });
  }
});

describe('straight line on a rising base', () => {
  it('direct runoff = triangle, baseflow = the rising line (exact)', () => {
    // base 2 + 0.1·t m³/s (t in h): the straight line from the rise (10 h) to the end (30 h) is the base itself
    const s = triangleSeries((t) => 2 + 0.1 * t, 10, 10, 14, 30, 0.5, 60);
    const b = separateBaseflow(s, { kind: 'straight-line' }, { points: points(10, 14, 22, 30) });
    for (let i = 0; i < b.length; i++) expect(b[i]).toBeCloseTo(2 + 0.1 * i * 0.5, 12);
    expect(summarizeEvent(s, b).directVolume_m3).toBeCloseTo(360_000, 4); // exact: ½·10 m³/s·20 h·3600 s/h
  });
});

describe('recession extensions (Q = Q₀·k^t, exact on exponential pre- and post-event flows)', () => {
  // Invented flows: pre-event recession 5·e^{−0.02 t}, post-event recession from 30 h at e^{−0.01 t};
  // the event adds a triangle of 20 m³/s from 10 h to 30 h peaking at 14 h.
  const pre = (t: number) => 5 * Math.exp(-0.02 * t);
  const post = (t: number) => 5 * Math.exp(-0.02 * 30) * 1.5 * Math.exp(-0.01 * (t - 30));
  const base = (t: number) => (t <= 10 ? pre(t) : t >= 30 ? post(t) : pre(t) + ((post(t) - pre(t)) * (t - 10)) / 20);
  const s = triangleSeries(base, 20, 10, 14, 30, 0.5, 60);
  const p = points(10, 14, 20, 30);
  const idx = (h: number) => Math.round(h / 0.5);

  it('concave: the pre-event recession to under the peak, then straight to the end of runoff', () => {
    const b = separateBaseflow(s, { kind: 'concave' }, { points: p });
    const underPeak = pre(14); // exact: the fitted recession of an exact exponential is that exponential
    expect(b[idx(12)]).toBeCloseTo(pre(12), 10);
    expect(b[idx(14)]).toBeCloseTo(underPeak, 10);
    expect(b[idx(22)]).toBeCloseTo(underPeak + ((post(30) - underPeak) * 8) / 16, 10);
    expect(b[idx(40)]).toBe(s.discharge_m3s[idx(40)]);
  });

  it('variable slope: pre-event recession to the peak, post-event recession back to the inflection, joined', () => {
    const b = separateBaseflow(s, { kind: 'variable-slope' }, { points: p });
    const underPeak = pre(14);
    const underInflection = post(20); // exact: the post-event exponential extended back from 30 h to 20 h
    expect(b[idx(14)]).toBeCloseTo(underPeak, 10);
    expect(b[idx(17)]).toBeCloseTo(underPeak + ((underInflection - underPeak) * 3) / 6, 10);
    expect(b[idx(25)]).toBeCloseTo(post(25), 10);
    expect(b[idx(5)]).toBe(s.discharge_m3s[idx(5)]);
  });

  it('constant discharge: held at the rise-start flow until the falling limb meets it', () => {
    const b = separateBaseflow(s, { kind: 'constant-discharge' }, { points: p });
    const level = pre(10);
    expect(b[idx(12)]).toBeCloseTo(level, 12);
    expect(b[idx(29)]).toBeCloseTo(level, 12);
    // after the limb has met the level (the flow is below it), the baseflow is the flow
    expect(b[idx(50)]).toBe(s.discharge_m3s[idx(50)]);
  });

  it('key points are found when not given, and the result says so', () => {
    const r = separateBaseflowDetailed(s, { kind: 'variable-slope' });
    expect(r.points?.peak_ms).toBe(T0 + 14 * H);
    expect(r.notes.join(' ')).toMatch(/found automatically/);
  });
});

describe('trapezoid volumes use the union of reading times and the window ends', () => {
  it('a window ending between readings on a straight segment integrates exactly', () => {
    const s = triangleSeries(() => 0, 10, 10, 14, 30, 1, 40);
    const zero = new Float64Array(s.time_ms.length);
    // exact: from 12.5 h to 20.25 h under the triangle: rising part 12.5–14 h: (6.25 + 10)/2·1.5 h,
    // falling part 14–20.25 h: (10 + 6.09375)/2·6.25 h
    const expected = ((6.25 + 10) / 2) * 1.5 * 3600 + ((10 + 6.09375) / 2) * 6.25 * 3600;
    const sum = summarizeEvent(s, zero, { from_ms: T0 + 12.5 * H, to_ms: T0 + 20.25 * H });
    expect(sum.totalVolume_m3).toBeCloseTo(expected, 6);
    expect(sum.peak_m3s).toBe(10);
    expect(trapezoid(s.time_ms, s.discharge_m3s)).toBeCloseTo(0.5 * 10 * 20 * 3600, 6);
  });
});
