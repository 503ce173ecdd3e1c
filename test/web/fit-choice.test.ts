import { describe, expect, it } from 'vitest';
import { dischargeAt, fitSegments, type GaugingRecord } from '../../core';
import { DEFAULT_FIT_CHOICES, defaultSelection, plainFitWarning, runFit } from '../../web/screens/Ratings/fit-choice';

// Invented gaugings around Q = 7·(h − 0.15)^1.9 with a few per cent of scatter.
const scatter = [1.02, 0.97, 1.01, 0.99, 1.03, 0.98, 1.0, 1.02, 0.97, 1.01, 0.99, 1.02];
const gaugings: GaugingRecord[] = scatter.map((f, i) => {
  const h = 0.3 + 0.12 * i;
  return {
    id: `00000000-0000-4000-8000-${String(i).padStart(12, '0')}`, rev: 'r', updated_ms: 0, siteId: 's', time_ms: Date.UTC(2025, i, 1),
    meanStage_m: h, discharge_m3s: 7 * (h - 0.15) ** 1.9 * f, method: 'velocity-area', grade: 'good', observer: '', note: '',
  };
});

describe('fit choices', () => {
  it('ticks the latest gaugings by default', () => {
    const s = defaultSelection(gaugings, 5);
    expect([...s].sort()).toEqual(gaugings.slice(7).map((g) => g.id));
  });
  // oracle: the core fit itself on the same points (the screen must add nothing of its own)
  it('fits exactly what the core fits on the ticked gaugings', () => {
    const out = runFit(gaugings, new Set(gaugings.map((g) => g.id)), DEFAULT_FIT_CHOICES, 'metric');
    if (!out.ok) throw new Error(JSON.stringify(out.errors));
    const ref = fitSegments(gaugings.map((g) => ({ stage_m: g.meanStage_m, discharge_m3s: g.discharge_m3s })));
    expect(out.fit.standardError_pct).toBe(ref.standardError_pct);
    expect(out.fit.rating.segments[0].offset_m).toBeCloseTo(0.15, 1);
    expect(out.used).toHaveLength(12);
    const two = runFit(gaugings, new Set(gaugings.map((g) => g.id)), { ...DEFAULT_FIT_CHOICES, segmentCount: 2, breakpointText: '0.8' }, 'metric');
    if (!two.ok) throw new Error(JSON.stringify(two.errors));
    expect(two.fit.rating.segments).toHaveLength(2);
    expect(dischargeAt(two.fit.rating, 0.8 - 1e-9)).toBeCloseTo(dischargeAt(two.fit.rating, 0.8), 6);
  });
  it('refuses a fixed offset above the lowest gauging, a stray breakpoint and too few gaugings, naming the field', () => {
    const all = new Set(gaugings.map((g) => g.id));
    const a = runFit(gaugings, all, { ...DEFAULT_FIT_CHOICES, offsetMode: 'fixed', offsetText: '0.35' }, 'metric');
    expect(a.ok ? [] : a.errors.map((e) => e.field)).toEqual(['offset']);
    const b = runFit(gaugings, all, { ...DEFAULT_FIT_CHOICES, segmentCount: 2, breakpointText: 'x' }, 'metric');
    expect(b.ok ? [] : b.errors.map((e) => e.field)).toEqual(['breakpoint']);
    const c = runFit(gaugings, new Set([gaugings[0].id, gaugings[1].id]), DEFAULT_FIT_CHOICES, 'metric');
    expect(c.ok ? '' : c.errors[0].text).toMatch(/at least 4 gaugings with a discharge above 0; 2 are ticked/);
    const d = runFit(gaugings, all, { ...DEFAULT_FIT_CHOICES, segmentCount: 2, breakpointText: '1.5' }, 'metric');
    expect(d.ok ? '' : d.errors[0].text).not.toMatch(/fitRating|fitSegments|_m\b/);
  });
  it('says which gauging a fit warning is about in the screen’s words', () => {
    expect(plainFitWarning('The gauging at index 3 (stage 0.660 m, 2.1 m³/s) deviates by +9.0 % from the fit.')).toBe('Gauging 4 (counting from the oldest ticked) (stage 0.660 m, 2.1 m³/s) deviates by +9.0 % from the fit.');
  });
});
