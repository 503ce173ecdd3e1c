import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  KM2_PER_MI2,
  M3S_PER_CFS,
  M3_PER_ACRE_FT,
  MM_PER_IN,
  M_PER_FT,
  acreFtToM3,
  cfsToM3s,
  displayUnit,
  fromDisplay,
  ftToM,
  inToMm,
  km2ToMi2,
  m3ToAcreFt,
  m3sToCfs,
  mToFt,
  mi2ToKm2,
  mmToIn,
  toDisplay,
  type DisplayQuantity,
} from '../../core/units';

describe('exact unit factors', () => {
  // NIST SP 811 (2008), Appendix B.8: foot = 3.048 E-01 m (exact).
  it('foot', () => expect(M_PER_FT).toBe(0.3048));
  // NIST SP 811 B.8: cubic foot per second = 2.831 685 E-02 m³/s; exact value is 0.3048³.
  it('cubic foot per second', () => {
    expect(M3S_PER_CFS).toBe(0.028316846592);
    expect(M3S_PER_CFS).toBeCloseTo(0.3048 ** 3, 17);
  });
  // NIST SP 811 B.8: square mile = 2.589 988 E+00 km²; exact value is (1609.344 m)² = 2.589988110336 km².
  it('square mile', () => {
    expect(KM2_PER_MI2).toBe(2.589988110336);
    expect(KM2_PER_MI2).toBeCloseTo(1.609344 ** 2, 14);
  });
  // NIST SP 811 B.8: inch = 2.54 E-02 m (exact).
  it('inch', () => expect(MM_PER_IN).toBe(25.4));
  // exact: 1 acre = 43 560 ft², so with the international foot 1 acre-foot = 43 560 × 0.3048³ m³
  // = 1233.48183754752 m³ (DOMAIN.md §6; NIST SP 811 lists 1.233 489 E+03 m³ for the survey-foot
  // acre-foot, from memory).
  it('acre-foot', () => {
    expect(M3_PER_ACRE_FT).toBe(1233.48183754752);
    expect(M3_PER_ACRE_FT).toBeCloseTo(43560 * 0.3048 ** 3, 9);
  });
});

describe('conversions', () => {
  // exact: definitions of the factors above
  it('convert known values both ways', () => {
    expect(ftToM(10)).toBeCloseTo(3.048, 14);
    expect(mToFt(3.048)).toBeCloseTo(10, 13);
    expect(cfsToM3s(100)).toBeCloseTo(2.8316846592, 13);
    expect(m3sToCfs(2.8316846592)).toBeCloseTo(100, 11);
    expect(mi2ToKm2(1)).toBe(2.589988110336);
    expect(km2ToMi2(2.589988110336)).toBeCloseTo(1, 14);
    expect(inToMm(2)).toBe(50.8);
    expect(mmToIn(50.8)).toBeCloseTo(2, 14);
    expect(acreFtToM3(1)).toBe(1233.48183754752);
    expect(m3ToAcreFt(1233.48183754752)).toBeCloseTo(1, 14);
  });

  // exact: a conversion and its inverse compose to the identity
  it('round trips for every display quantity', () => {
    const quantities: DisplayQuantity[] = ['stage', 'length', 'discharge', 'velocity', 'area', 'depth', 'volume'];
    fc.assert(
      fc.property(fc.constantFrom(...quantities), fc.double({ min: -1e6, max: 1e6, noNaN: true }), (q, x) => {
        const back = fromDisplay(q, toDisplay(q, x, 'us'), 'us');
        expect(Math.abs(back - x)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(x)));
        expect(toDisplay(q, x, 'metric')).toBe(x);
      }),
    );
  });

  // exact: factors above
  it('display values and labels', () => {
    expect(toDisplay('stage', 0.3048, 'us')).toBeCloseTo(1, 14);
    expect(toDisplay('discharge', 0.028316846592, 'us')).toBeCloseTo(1, 14);
    expect(toDisplay('velocity', 0.3048, 'us')).toBeCloseTo(1, 14);
    expect(toDisplay('area', 2.589988110336, 'us')).toBeCloseTo(1, 14);
    expect(toDisplay('depth', 25.4, 'us')).toBeCloseTo(1, 14);
    expect(toDisplay('volume', 1233.48183754752, 'us')).toBeCloseTo(1, 14);
    expect(fromDisplay('stage', 1, 'us')).toBe(0.3048);
    expect(displayUnit('stage', 'metric')).toBe('m');
    expect(displayUnit('stage', 'us')).toBe('ft');
    expect(displayUnit('discharge', 'metric')).toBe('m³/s');
    expect(displayUnit('discharge', 'us')).toBe('ft³/s');
    expect(displayUnit('area', 'us')).toBe('mi²');
    expect(displayUnit('depth', 'metric')).toBe('mm');
    expect(displayUnit('volume', 'us')).toBe('acre-ft');
  });
});

describe('bad input', () => {
  it('non-finite values throw a RangeError naming the value', () => {
    expect(() => ftToM(Number.NaN)).toThrow(RangeError);
    expect(() => ftToM(Number.NaN)).toThrow(/ftToM.*finite.*NaN/);
    expect(() => m3sToCfs(Infinity)).toThrow(/m3sToCfs.*finite.*Infinity/);
    expect(() => toDisplay('discharge', Number.NaN, 'us')).toThrow(/toDisplay.*finite discharge.*NaN/);
    expect(() => fromDisplay('depth', -Infinity, 'metric')).toThrow(/fromDisplay.*finite depth.*-Infinity/);
  });
  it('unknown quantity or unit system throws a RangeError listing the choices', () => {
    expect(() => toDisplay('speed' as DisplayQuantity, 1, 'us')).toThrow(RangeError);
    expect(() => toDisplay('speed' as DisplayQuantity, 1, 'us')).toThrow(/unknown quantity "speed".*stage/);
    expect(() => displayUnit('stage', 'imperial' as 'us')).toThrow(/unknown unit system "imperial".*'metric' or 'us'/);
  });
});
