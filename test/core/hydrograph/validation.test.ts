import { describe, expect, it } from 'vitest';
import {
  findEventPoints,
  findInflection,
  separateBaseflow,
  summarizeEvent,
  unitHydrograph,
  type EventPoints,
  type SeparationMethod,
  type Series,
} from '../../../core/hydrograph/index';
import { H, T0, triangleSeries } from '../../support/hydrograph-series';

const good = triangleSeries(() => 2, 10, 10, 14, 30, 1, 48);
const zeros = new Float64Array(good.time_ms.length);
const series = (t: number[], q: number[]): Series => ({ time_ms: t, discharge_m3s: q });

// Every bad input throws a RangeError whose message names the problem (ARCHITECTURE.md, errors).
describe('bad series', () => {
  const cases: [string, Series, RegExp][] = [
    ['empty', series([], []), /at least one reading; got an empty series/],
    ['times not ascending', series([0, 2, 1], [1, 1, 1]), /time_ms strictly ascending; reading 2/],
    ['repeated time', series([0, 1, 1], [1, 1, 1]), /time_ms strictly ascending/],
    ['negative discharge', series([0, 1, 2], [1, -0.5, 1]), /discharge ≥ 0 m³\/s; discharge_m3s\[1\] is -0.5/],
    ['infinite discharge', series([0, 1, 2], [1, Infinity, 1]), /finite discharges/],
    ['non-finite time', series([0, NaN, 2], [1, 1, 1]), /finite times; time_ms\[1\]/],
    ['length mismatch', series([0, 1, 2], [1, 1]), /as many discharges as times/],
    ['all gaps', series([0, 1], [NaN, NaN]), /all 2 are gaps/],
  ];
  for (const [name, s, message] of cases) {
    it(name, () => {
      for (const call of [
        () => findEventPoints(s),
        () => separateBaseflow(s, { kind: 'lyne-hollick' }),
        () => summarizeEvent(s, []),
        () => unitHydrograph(s, [], { area_km2: 1 }),
      ]) {
        expect(call).toThrow(RangeError);
        expect(call).toThrow(message);
      }
    });
  }
});

describe('bad series as Float64Arrays (the filters check these inside their own loop first)', () => {
  const f64 = (t: number[], q: number[]): Series => ({ time_ms: Float64Array.from(t), discharge_m3s: Float64Array.from(q) });
  const cases: [string, Series, RegExp][] = [
    ['times not ascending', f64([0, 1, 2, 1.5, 4], [1, 1, 1, 1, 1]), /time_ms strictly ascending; reading 3/],
    ['repeated time', f64([0, 1, 1, 2], [1, 1, 1, 1]), /time_ms strictly ascending; reading 2/],
    ['negative discharge', f64([0, 1, 2, 3], [1, 1, -0.5, 1]), /discharge ≥ 0 m³\/s; discharge_m3s\[2\] is -0.5/],
    ['negative first discharge', f64([0, 1, 2, 3], [-1, 1, 1, 1]), /discharge_m3s\[0\] is -1/],
    ['infinite discharge', f64([0, 1, 2, 3], [1, 1, 1, Infinity]), /finite discharges/],
    ['infinite time', f64([0, 1, 2, Infinity], [1, 1, 1, 1]), /finite times; time_ms\[3\]/],
    ['non-finite time', f64([0, NaN, 2, 3], [1, 1, 1, 1]), /finite times; time_ms\[1\]/],
    ['length mismatch', f64([0, 1, 2, 3], [1, 1, 1]), /as many discharges as times/],
  ];
  const filters: SeparationMethod[] = [
    { kind: 'lyne-hollick' },
    { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 },
    { kind: 'chapman-maxwell', recession: 0.925 },
  ];
  for (const [name, s, message] of cases) {
    it(name, () => {
      for (const method of filters) {
        expect(() => separateBaseflow(s, method)).toThrow(RangeError);
        expect(() => separateBaseflow(s, method)).toThrow(message);
      }
    });
  }
});

describe('bad key points', () => {
  const p: EventPoints = { riseStart_ms: T0 + 10 * H, peak_ms: T0 + 14 * H, inflection_ms: T0 + 18 * H, runoffEnd_ms: T0 + 30 * H };
  const cases: [string, EventPoints, RegExp][] = [
    ['peak before rise', { ...p, peak_ms: T0 + 5 * H }, /in order.*peak_ms .* is before riseStart_ms/],
    ['inflection before peak', { ...p, inflection_ms: T0 + 12 * H }, /inflection_ms .* is before peak_ms/],
    ['end before inflection', { ...p, runoffEnd_ms: T0 + 16 * H }, /runoffEnd_ms .* is before inflection_ms/],
    ['end outside', { ...p, runoffEnd_ms: T0 + 60 * H }, /runoffEnd_ms inside the series/],
    ['rise outside', { ...p, riseStart_ms: T0 - H }, /riseStart_ms inside the series/],
    ['not a number', { ...p, peak_ms: NaN }, /peak_ms as a finite time/],
    ['all equal', { riseStart_ms: T0, peak_ms: T0, inflection_ms: T0, runoffEnd_ms: T0 }, /end of runoff after the rise start/],
  ];
  for (const [name, points, message] of cases) {
    it(name, () => {
      const call = () => separateBaseflow(good, { kind: 'variable-slope' }, { points });
      expect(call).toThrow(RangeError);
      expect(call).toThrow(message);
    });
  }
});

describe('bad areas and method settings', () => {
  it('area ≤ 0 or not a number', () => {
    for (const area_km2 of [0, -3, NaN, Infinity]) {
      expect(() => findEventPoints(good, { area_km2 })).toThrow(/catchment area above 0 km²/);
      expect(() => separateBaseflow(good, { kind: 'straight-line' }, { area_km2 })).toThrow(/catchment area above 0 km²/);
      expect(() => summarizeEvent(good, zeros, { area_km2 })).toThrow(/catchment area above 0 km²/);
      expect(() => unitHydrograph(good, zeros, { area_km2 })).toThrow(/catchment area above 0 km²/);
    }
  });

  const methods: [SeparationMethod, RegExp][] = [
    [{ kind: 'lyne-hollick', alpha: 1 }, /lyne-hollick alpha in \(0, 1\); got 1/],
    [{ kind: 'lyne-hollick', passes: 0 }, /passes as an integer from 1 to 9; got 0/],
    [{ kind: 'eckhardt', bfiMax: 0, recession: 0.98 }, /eckhardt bfiMax in \(0, 1\]; got 0/],
    [{ kind: 'eckhardt', bfiMax: 0.8, recession: 1.2 }, /eckhardt recession in \(0, 1\); got 1.2/],
    [{ kind: 'chapman-maxwell', recession: 0 }, /chapman-maxwell recession in \(0, 1\)/],
    [{ kind: 'smoothed-minima', block_days: -1 }, /block_days above 0; got -1/],
    [{ kind: 'smoothed-minima', factor: 1.5 }, /factor in \(0, 1\]; got 1.5/],
    [{ kind: 'local-minimum', interval_days: 0 }, /interval_days above 0; got 0/],
    [{ kind: 'made-up' } as unknown as SeparationMethod, /known method kind; got "made-up"/],
  ];
  for (const [method, message] of methods) {
    it(`${method.kind} ${JSON.stringify(method)}`, () => {
      expect(() => separateBaseflow(good, method)).toThrow(RangeError);
      expect(() => separateBaseflow(good, method)).toThrow(message);
    });
  }

  it('findInflection needs its window inside the series and in order', () => {
    expect(() => findInflection(good, T0 + 20 * H, T0 + 10 * H)).toThrow(/end_ms after peak_ms/);
    expect(() => findInflection(good, T0 + 20 * H, T0 + 100 * H)).toThrow(/inside the series/);
    expect(() => findInflection(good, T0 + 14 * H, T0 + 30 * H, { halfWindow_readings: 1 })).toThrow(/integer ≥ 2/);
  });
});
