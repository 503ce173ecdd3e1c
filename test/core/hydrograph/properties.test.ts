import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { separateBaseflow, summarizeEvent, type SeparationMethod, type Series } from '../../../core/hydrograph/index';
import { pulse, T0 } from '../../support/hydrograph-series';

// Random multi-peak hydrographs (invented): a base flow plus 1–4 gamma-shaped pulses, 120 h of record,
// regular (every 0.5 h) or irregular (random steps), optionally with a few missing readings.
const pulseArb = fc.record({
  onset_h: fc.double({ min: 5, max: 60, noNaN: true }),
  peak: fc.double({ min: 1, max: 50, noNaN: true }),
  tp_h: fc.double({ min: 2, max: 12, noNaN: true }),
  n: fc.double({ min: 2, max: 8, noNaN: true }),
});
const hydrographArb = fc.record({
  base: fc.double({ min: 0.1, max: 5, noNaN: true }),
  pulses: fc.array(pulseArb, { minLength: 1, maxLength: 4 }),
  steps: fc.option(fc.array(fc.double({ min: 0.1, max: 1.5, noNaN: true }), { minLength: 240, maxLength: 240 }), { nil: undefined }),
  gaps: fc.array(fc.integer({ min: 1, max: 230 }), { maxLength: 3 }),
});
type Hydrograph = typeof hydrographArb extends fc.Arbitrary<infer T> ? T : never;

function hoursOf(h: Hydrograph): number[] {
  const hours = [0];
  for (let i = 0; i < 240; i++) hours.push(hours[i] + (h.steps ? h.steps[i] : 0.5));
  return hours;
}
function flowAt(h: Hydrograph, t_h: number): number {
  return h.base + h.pulses.reduce((sum, p) => sum + pulse(t_h - p.onset_h, p.peak, p.tp_h, p.n), 0);
}
/** The series with time built from hours through `msPerUnit` (1 h = 3 600 000 ms whatever the unit). */
function build(h: Hydrograph, msPerUnit: number, unitsPerHour: number, withGaps: boolean): Series {
  const hours = hoursOf(h);
  const q = hours.map((t) => flowAt(h, t));
  if (withGaps) for (const g of h.gaps) q[g] = NaN;
  return { time_ms: hours.map((t) => T0 + t * unitsPerHour * msPerUnit), discharge_m3s: q };
}

const methods: SeparationMethod[] = [
  { kind: 'constant-discharge' },
  { kind: 'straight-line' },
  { kind: 'concave' },
  { kind: 'variable-slope' },
  { kind: 'lyne-hollick' },
  { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 },
  { kind: 'eckhardt', bfiMax: 0.25, recession: 0.9 },
  { kind: 'chapman-maxwell', recession: 0.925 },
  { kind: 'smoothed-minima' },
  { kind: 'local-minimum', interval_days: 9 },
];

/**
 * Hours of the random hydrograph per real hour. The minima methods work on daily means with blocks and
 * intervals in days, so their hydrographs are stretched 20-fold: 100 days of record at 10-h steps with storms of
 * 40–240 h, the same proportions to a 5-day block as the former 0.25-day blocks had on the unstretched ones.
 */
function scaleFor(method: SeparationMethod): number {
  return method.kind === 'smoothed-minima' || method.kind === 'local-minimum' ? 20 : 1;
}

/** The series with its times rounded to whole ms (they are whole up to floating-point noise here). */
function wholeMs(s: Series): Series {
  return { time_ms: Array.from(s.time_ms, Math.round), discharge_m3s: s.discharge_m3s };
}

function bridged(s: Series): Float64Array {
  const q = Float64Array.from(s.discharge_m3s);
  for (let i = 0; i < q.length; i++) {
    if (!Number.isNaN(q[i])) continue;
    let a = i - 1;
    while (a >= 0 && Number.isNaN(s.discharge_m3s[a])) a--;
    let c = i + 1;
    while (c < q.length && Number.isNaN(s.discharge_m3s[c])) c++;
    const t = s.time_ms;
    q[i] = s.discharge_m3s[a] + ((s.discharge_m3s[c] - s.discharge_m3s[a]) * (t[i] - t[a])) / (t[c] - t[a]);
  }
  return q;
}

describe('properties on random multi-peak hydrographs (fast-check)', () => {
  for (const method of methods) {
    it(`${JSON.stringify(method)}: 0 ≤ b ≤ Q at every reading; direct + baseflow = total`, () => {
      fc.assert(
        fc.property(hydrographArb, fc.boolean(), (h, withGaps) => {
          const s = build(h, 3_600_000, scaleFor(method), withGaps);
          const q = bridged(s);
          const b = separateBaseflow(s, method, { area_km2: 120 });
          expect(b.length).toBe(q.length);
          for (let i = 0; i < q.length; i++) {
            expect(b[i]).toBeGreaterThanOrEqual(0);
            expect(b[i]).toBeLessThanOrEqual(q[i]);
          }
          const sum = summarizeEvent(s, b);
          // the test's own trapezoid of Q − b (m³), independent of the summary's
          let direct = 0;
          for (let i = 1; i < q.length; i++) {
            direct += ((q[i] - b[i] + q[i - 1] - b[i - 1]) / 2) * ((s.time_ms[i] - s.time_ms[i - 1]) / 1000);
          }
          expect(sum.directVolume_m3 + sum.baseflowVolume_m3).toBeCloseTo(sum.totalVolume_m3, 6);
          expect(Math.abs(sum.directVolume_m3 - direct)).toBeLessThanOrEqual(1e-9 * sum.totalVolume_m3);
        }),
        { numRuns: 40 },
      );
    });
  }

  it('volumes do not depend on the time unit the series was built in (hours, minutes, seconds)', () => {
    fc.assert(
      fc.property(hydrographArb, fc.constantFrom(...methods), (h, method) => {
        // exact: 1 h = 60 min = 3600 s, so the same instants in ms; only rounding may differ
        const c = scaleFor(method);
        const inHours = build(h, 3_600_000, c, false);
        const inMinutes = build(h, 60_000, 60 * c, false);
        const inSeconds = build(h, 1000, 3600 * c, false);
        const v = [inHours, inMinutes, inSeconds].map((s) => summarizeEvent(s, separateBaseflow(s, method, { area_km2: 120 })));
        for (const other of v.slice(1)) {
          expect(other.totalVolume_m3).toBeCloseTo(v[0].totalVolume_m3, 3);
          expect(other.directVolume_m3).toBeCloseTo(v[0].directVolume_m3, 3);
        }
        // and the total matches the test's own trapezoid computed in hours × 3600 s/h
        const hours = hoursOf(h);
        let total = 0;
        for (let i = 1; i < hours.length; i++) {
          total += ((flowAt(h, hours[i]) + flowAt(h, hours[i - 1])) / 2) * (hours[i] - hours[i - 1]) * 3600 * c;
        }
        expect(v[0].totalVolume_m3).toBeCloseTo(total, 3);
      }),
      { numRuns: 60 },
    );
  });

  it('stretching time by c multiplies every volume by c (methods with no time constant in days)', () => {
    // Only the event methods: the filters' constants are per day (applied as c^(Δt/1 day)) and the minima
    // methods' blocks and intervals are in days, so stretching time changes their baseflow by design.
    const stretchable = methods.filter((m) => ['constant-discharge', 'straight-line', 'concave', 'variable-slope'].includes(m.kind));
    // Key points are returned in whole milliseconds, so the readings are kept on whole milliseconds too: regular
    // 0.5-h steps (1 800 000 ms) and c in thousandths (c·1 800 000 ms is a whole number), and the rise and peak,
    // which are reading times, scale exactly.
    fc.assert(
      fc.property(hydrographArb, fc.constantFrom(...stretchable), fc.integer({ min: 200, max: 5000 }), (hRandom, method, k) => {
        const h = { ...hRandom, steps: undefined };
        const c = k / 1000;
        const one = wholeMs(build(h, 3_600_000, 1, false));
        const stretched = wholeMs(build(h, 3_600_000, c, false));
        const a = summarizeEvent(one, separateBaseflow(one, method));
        const b = summarizeEvent(stretched, separateBaseflow(stretched, method));
        expect(b.totalVolume_m3 / a.totalVolume_m3).toBeCloseTo(c, 9);
        expect(Math.abs(b.directVolume_m3 - c * a.directVolume_m3)).toBeLessThanOrEqual(1e-6 * b.totalVolume_m3);
      }),
      { numRuns: 60 },
    );
  });
});
