import { describe, expect, it } from 'vitest';
import { dischargeAt, M_PER_FT, shiftAt } from '../../core';
import { blankShiftForm, mergeShifts, parseShiftForm } from '../../web/screens/Ratings/shift-form';

const ctx = { units: 'metric' as const, timeZone: 'UTC', validFrom_ms: Date.UTC(2026, 0, 1) };

describe('parseShiftForm', () => {
  it('adds a constant shift that changes the discharge as Q = C·(h + s − e)^b (DOMAIN.md §2, Kennedy 1983)', () => {
    const p = parseShiftForm({ ...blankShiftForm('2026-03-01T00:00'), shiftText: '-0.02' }, ctx);
    if (!p.ok) throw new Error(JSON.stringify(p.errors));
    const t = Date.UTC(2026, 3, 1);
    const s = shiftAt(p.added, t, 0.5);
    expect(s).toBe(-0.02);
    expect(dischargeAt({ segments: [{ fromStage_m: 0.1, offset_m: 0.1, coefficient: 5, exponent: 2 }] }, 0.5, s)).toBeCloseTo(5 * 0.38 ** 2, 12);
  });
  // exact: linear proration in time gives the mean of the two shifts halfway between their dates
  it('adds a prorated shift as two dated shifts; halfway it is the mean', () => {
    const p = parseShiftForm({ ...blankShiftForm('2026-03-01T00:00'), kind: 'prorated', shiftText: '0', toText: '2026-03-11T00:00', endShiftText: '0.04' }, ctx);
    if (!p.ok) throw new Error(JSON.stringify(p.errors));
    expect(shiftAt(p.added, Date.UTC(2026, 2, 6), 1)).toBeCloseTo(0.02, 15);
    expect(shiftAt(p.added, Date.UTC(2026, 4, 1), 1)).toBe(0.04);
  });
  it('reads a stage-variable shift in feet (linear between points)', () => {
    const p = parseShiftForm({ ...blankShiftForm('2026-03-01T00:00'), kind: 'stage-variable', pointsText: '1.0 -0.1\n2.0 0.1' }, { ...ctx, units: 'us' });
    if (!p.ok) throw new Error(JSON.stringify(p.errors));
    expect(shiftAt(p.added, Date.UTC(2026, 3, 1), 1.5 * M_PER_FT) / M_PER_FT).toBeCloseTo(0, 12);
  });
  it('refuses bad input naming the field; merging replaces a shift at the same time', () => {
    const bad = parseShiftForm({ ...blankShiftForm('2025-03-01T00:00'), kind: 'stage-variable', pointsText: '1 0.1\n0.5 0.2' }, ctx);
    expect(bad.ok ? [] : bad.errors.map((e) => e.field)).toEqual(['shiftFrom', 'shiftPoints']);
    const order = parseShiftForm({ ...blankShiftForm('2026-03-01T00:00'), kind: 'prorated', shiftText: '0', toText: '2026-02-01T00:00', endShiftText: 'x' }, ctx);
    expect(order.ok ? [] : order.errors.map((e) => e.field)).toEqual(['shiftEnd', 'shiftTo']);
    const a = { time_ms: 1, curve: { points: [{ stage_m: 0, shift_m: 0.1 }] }, toNext: 'hold' as const };
    const b = { ...a, curve: { points: [{ stage_m: 0, shift_m: 0.2 }] } };
    expect(mergeShifts([a], [b])).toEqual([b]);
  });
});
