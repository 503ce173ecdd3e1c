import { describe, expect, it } from 'vitest';
import { checksRating, gradeOf, type MeasurementGrade } from '../../../core/rating/index';

describe('measurement grades', () => {
  // USGS discharge-measurement quality codes: excellent ≤ 2 %, good ≤ 5 %, fair ≤ 8 %, poor > 8 %
  const table: [number, MeasurementGrade][] = [
    [0, 'excellent'], [2, 'excellent'], [2.01, 'good'], [5, 'good'], [5.5, 'fair'], [8, 'fair'], [8.01, 'poor'], [30, 'poor'],
  ];
  it.each(table)('%s %% is %s', (pct, grade) => expect(gradeOf(pct)).toBe(grade));

  // DOMAIN.md §2: a gauging checks the rating when |d| is within its grade
  it('checks the rating within the grade', () => {
    expect(checksRating(4.9, 'good')).toBe(true);
    expect(checksRating(-5, 'good')).toBe(true);
    expect(checksRating(-5.1, 'good')).toBe(false);
    expect(checksRating(2.5, 'excellent')).toBe(false);
    expect(checksRating(7.9, 'fair')).toBe(true);
    expect(checksRating(8.1, 'fair')).toBe(false);
    expect(checksRating(40, 'poor')).toBe(true);
  });
  it('refuses bad input', () => {
    expect(() => gradeOf(-1)).toThrow(RangeError);
    expect(() => gradeOf(-1)).toThrow(/uncertainty ≥ 0 %; got -1/);
    expect(() => gradeOf(Number.NaN)).toThrow(/finite uncertainty_pct; got NaN/);
    expect(() => checksRating(Infinity, 'good')).toThrow(/finite deviation_pct; got Infinity/);
    expect(() => checksRating(1, 'great' as MeasurementGrade)).toThrow(/'excellent', 'good', 'fair' or 'poor'; got great/);
  });
});
