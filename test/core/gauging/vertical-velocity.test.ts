import { describe, expect, it } from 'vitest';
import {
  exceedsWadingLimit,
  suggestedVelocityMethod,
  verticalMeanVelocity,
  type PointVelocities,
} from '../../../core/gauging/index';

describe('mean velocity in a vertical', () => {
  // Buchanan & Somers 1969 (USGS TWRI 3-A8): v = v0.6; v = (v0.2 + v0.8)/2; three-point: the mean of
  // v0.6 and (v0.2 + v0.8)/2 (Turnipseed & Sauer 2010)
  it('by method', () => {
    expect(verticalMeanVelocity({ kind: 'six-tenths', v06_mps: 0.42 })).toBe(0.42);
    expect(verticalMeanVelocity({ kind: 'two-point', v02_mps: 0.9, v08_mps: 0.5 })).toBeCloseTo(0.7, 15);
    expect(verticalMeanVelocity({ kind: 'three-point', v02_mps: 0.9, v06_mps: 0.8, v08_mps: 0.5 })).toBeCloseTo(0.75, 15);
  });
  // exact: on a logarithmic profile v(y) = ln(y/y0) (y above the bed), √(0.2·0.8) = 0.4 makes the
  // two-point mean equal v at 0.6 depth below the surface, and the depth mean ∫_{y0}^{d} v dy / d =
  // ln(d/y0) − 1 + y0/d falls short of it by 1 + ln 0.4 − y0/d.
  it('two-point mean on a logarithmic profile', () => {
    const depth = 1.2;
    const y0 = 0.003;
    const v = (fromBed: number) => Math.log(fromBed / y0);
    const depthMean = Math.log(depth / y0) - 1 + y0 / depth;
    const twoPoint = verticalMeanVelocity({ kind: 'two-point', v02_mps: v(0.8 * depth), v08_mps: v(0.2 * depth) });
    const sixTenths = verticalMeanVelocity({ kind: 'six-tenths', v06_mps: v(0.4 * depth) });
    expect(twoPoint).toBeCloseTo(sixTenths, 14);
    expect(twoPoint - depthMean).toBeCloseTo(1 + Math.log(0.4) - y0 / depth, 14);
  });
  // Buchanan & Somers 1969: 0.6 method below 2.5 ft (0.75 m)
  it('suggests the method by depth', () => {
    expect(suggestedVelocityMethod(0.74)).toBe('six-tenths');
    expect(suggestedVelocityMethod(0.75)).toBe('two-point');
  });
  it('refuses bad input', () => {
    expect(() => verticalMeanVelocity({ kind: 'two-point', v02_mps: Number.NaN, v08_mps: 1 })).toThrow(RangeError);
    expect(() => verticalMeanVelocity({ kind: 'two-point', v02_mps: Number.NaN, v08_mps: 1 })).toThrow(/finite v02_mps; got NaN/);
    expect(() => verticalMeanVelocity({ kind: 'three-point', v02_mps: 1, v06_mps: Infinity, v08_mps: 1 })).toThrow(/finite v06_mps; got Infinity/);
    expect(() => verticalMeanVelocity({ kind: 'surface' } as unknown as PointVelocities)).toThrow(/kind 'six-tenths', 'two-point' or 'three-point'; got surface/);
    expect(() => suggestedVelocityMethod(-1)).toThrow(/finite depth ≥ 0 m; got -1/);
  });
});

describe('wading limit', () => {
  // USGS practice, from memory: depth (ft) × velocity (ft/s) ≥ 10 → 10 × 0.3048² m²/s
  it('at and below the limit', () => {
    expect(exceedsWadingLimit(1, 0.9290304)).toBe(true);
    expect(exceedsWadingLimit(1, 0.929)).toBe(false);
    expect(exceedsWadingLimit(0.5, -2)).toBe(true);
    expect(() => exceedsWadingLimit(-1, 1)).toThrow(/finite depth ≥ 0 m; got -1/);
    expect(() => exceedsWadingLimit(1, Number.NaN)).toThrow(/finite velocity_mps; got NaN/);
  });
});
