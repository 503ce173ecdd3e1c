// The invented demo scenario: valid records, deterministic, and faithful to its own documented model.
import { describe, expect, it } from 'vitest';
import {
  demoFlow, demoRating, demoScenario, dischargeAt, fitRating, ratingContinuity, stageAt,
  validateGaugingBody, validateRatingBody, validateReadingBody, validateSiteBody,
} from '../../core';

const END = Date.UTC(2026, 10, 20, 6, 7); // any fixed time: the scenario is relative to its end

describe('demo scenario', () => {
  const s = demoScenario(END);

  it('passes the record validators for every record', () => {
    expect(() => validateSiteBody(s.site)).not.toThrow();
    expect(() => validateRatingBody(s.rating)).not.toThrow();
    for (const g of s.gaugings) validateGaugingBody(g);
    for (const r of s.readings) validateReadingBody(r);
  });

  it('is the same every time and has unique ids', () => {
    expect(demoScenario(END)).toEqual(s);
    const ids = [s.site.id, s.rating.id, ...s.gaugings.map((g) => g.id), ...s.readings.map((r) => r.id)];
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('has three weeks of 15-minute logger readings ending at the 15-minute mark before the end', () => {
    const logger = s.readings.filter((r) => r.source === 'logger');
    expect(logger).toHaveLength(21 * 96 + 1);
    expect(logger[logger.length - 1].time_ms).toBe(Date.UTC(2026, 10, 20, 6, 0));
    for (let i = 1; i < logger.length; i++) expect(logger[i].time_ms - logger[i - 1].time_ms).toBe(900_000);
    expect(s.gaugings).toHaveLength(12);
  });

  it('has a rating continuous at its breakpoint (within the 1 % check)', () => {
    const check = ratingContinuity(demoRating());
    expect(check.warnings).toEqual([]);
    expect(Math.abs(check.breakpoints[0].jump_pct)).toBeLessThan(1e-9);
  });

  it('turns back into the model flow within the ±2 mm reading noise (exact model inversion)', () => {
    const rating = demoRating();
    const logger = s.readings.filter((r) => r.source === 'logger');
    const start = logger[0].time_ms;
    for (const r of logger.filter((_, i) => i % 37 === 0)) {
      const q = demoFlow((r.time_ms - start) / 86_400_000);
      expect(Math.abs(r.stage_m - stageAt(rating, q))).toBeLessThanOrEqual(0.0025 + 1e-9);
    }
    const peak = logger.reduce((a, b) => (b.stage_m > a.stage_m ? b : a));
    expect(dischargeAt(rating, peak.stage_m)).toBeGreaterThan(6.5);
    expect(peak.stage_m).toBeGreaterThan(s.rating.gaugedRange_m![1]); // the peak is an extrapolation
  });

  it('gives gaugings that a power-law fit recovers closely (exponent in the usual 1.3–3.0 range)', () => {
    const fit = fitRating(s.gaugings.map((g) => ({ stage_m: g.meanStage_m, discharge_m3s: g.discharge_m3s })));
    expect(fit.segment.exponent).toBeGreaterThan(1.3);
    expect(fit.segment.exponent).toBeLessThan(3.0);
    expect(fit.standardError_pct).toBeLessThan(10);
  });
});
