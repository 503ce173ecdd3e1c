// The invented demo scenario: valid records, deterministic, and faithful to its own documented model.
import { describe, expect, it } from 'vitest';
import {
  demoFlow, demoLoggerRecord, demoRating, demoScenario, dischargeAt, fitRating, ratingContinuity, stageAt,
  validateGaugingBody, validateLoggerDayBody, validateRatingBody, validateReadingBody, validateSiteBody,
} from '../../core';

const END = Date.UTC(2026, 10, 20, 6, 7); // any fixed time: the scenario is relative to its end

describe('demo scenario', () => {
  const s = demoScenario(END);

  it('passes the record validators for every record', () => {
    expect(() => validateSiteBody(s.site)).not.toThrow();
    expect(() => validateRatingBody(s.rating)).not.toThrow();
    for (const g of s.gaugings) validateGaugingBody(g);
    for (const r of s.readings) validateReadingBody(r);
    for (const d of s.loggerDays) validateLoggerDayBody(d);
  });

  it('is the same every time and has unique ids', () => {
    expect(demoScenario(END)).toEqual(s);
    const ids = [s.site.id, s.rating.id, ...s.gaugings.map((g) => g.id), ...s.readings.map((r) => r.id), ...s.loggerDays.map((d) => d.id)];
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('has three weeks of 15-minute logger values, kept as logger days, ending at the 15-minute mark before the end', () => {
    const logger = demoLoggerRecord(s);
    expect(logger.time_ms).toHaveLength(21 * 96 + 1);
    expect(logger.time_ms[logger.time_ms.length - 1]).toBe(Date.UTC(2026, 10, 20, 6, 0));
    for (let i = 1; i < logger.time_ms.length; i++) expect(logger.time_ms[i] - logger.time_ms[i - 1]).toBe(900_000);
    expect(s.readings.every((r) => r.source === 'staff' && r.loggerCheck !== undefined)).toBe(true);
    expect(s.gaugings).toHaveLength(12);
  });

  it('corrects the logger drift from the checks: staff − logger at each check, linear between (common practice)', () => {
    const logger = demoLoggerRecord(s);
    for (const r of s.readings) {
      const i = logger.time_ms.indexOf(r.time_ms);
      expect(logger.raw_m[i]).toBe(r.loggerCheck!.logger_m);
      expect(logger.correction_m[i]).toBeCloseTo(r.stage_m - r.loggerCheck!.logger_m, 12);
    }
  });

  it('has a rating continuous at its breakpoint (within the 1 % check)', () => {
    const check = ratingContinuity(demoRating());
    expect(check.warnings).toEqual([]);
    expect(Math.abs(check.breakpoints[0].jump_pct)).toBeLessThan(1e-9);
  });

  it('turns back into the model flow within the reading noise and check offsets (exact model inversion)', () => {
    const rating = demoRating();
    const logger = demoLoggerRecord(s);
    const start = logger.time_ms[0];
    // Corrected values: ±2 mm noise, 1 mm rounding, and the checks' own 0–2 mm offsets carried by the correction.
    for (let i = 0; i < logger.time_ms.length; i += 37) {
      const q = demoFlow((logger.time_ms[i] - start) / 86_400_000);
      expect(Math.abs(logger.stage_m[i] - stageAt(rating, q))).toBeLessThanOrEqual(0.0055 + 1e-9);
    }
    const peak = Math.max(...logger.stage_m);
    expect(dischargeAt(rating, peak)).toBeGreaterThan(6.5);
    expect(peak).toBeGreaterThan(s.rating.gaugedRange_m![1]); // the peak is an extrapolation
  });

  it('gives gaugings that a power-law fit recovers closely (exponent in the usual 1.3–3.0 range)', () => {
    const fit = fitRating(s.gaugings.map((g) => ({ stage_m: g.meanStage_m, discharge_m3s: g.discharge_m3s })));
    expect(fit.segment.exponent).toBeGreaterThan(1.3);
    expect(fit.segment.exponent).toBeLessThan(3.0);
    expect(fit.standardError_pct).toBeLessThan(10);
  });
});
