import { describe, expect, it } from 'vitest';
import { dischargeAt, M3S_PER_CFS, M_PER_FT, ratingContinuity } from '../../core';
import { blankRatingForm, parseRatingForm, previewStages, readValidFrom, segmentTexts, type RatingForm } from '../../web/screens/Ratings/rating-form';

const ctx = { units: 'metric' as const, timeZone: 'Pacific/Auckland', now_ms: Date.UTC(2026, 5, 1, 0, 0) };
const form = (over: Partial<RatingForm> = {}): RatingForm => ({
  ...blankRatingForm(Date.UTC(2026, 0, 10, 0, 0), ctx.timeZone),
  segments: [{ fromText: '', coefficientText: '8.5', offsetText: '0.12', exponentText: '1.7' }],
  ...over,
});

describe('parseRatingForm', () => {
  it('reads a one-segment rating in SI; a blank first start means "from the offset"', () => {
    const p = parseRatingForm(form({ rangeLowText: '0,25', rangeHighText: '1.40', note: ' hand entry ' }), ctx);
    if (!p.ok) throw new Error(JSON.stringify(p.errors));
    expect(p.segments).toEqual([{ fromStage_m: 0.12, offset_m: 0.12, coefficient: 8.5, exponent: 1.7 }]);
    expect(p.gaugedRange_m).toEqual([0.25, 1.4]);
    expect(p.validFrom_ms).toBe(Date.UTC(2026, 0, 10, 0, 0));
    expect(p.note).toBe('hand entry');
  });
  // exact: NIST SP 811 factors; Q_cfs = C_us·(h_ft − e_ft)^b must give the same flow as the stored SI rating
  it('converts a rating typed in feet and ft³/s so the discharge is the same flow', () => {
    const p = parseRatingForm(form({ segments: [{ fromText: '', coefficientText: '30', offsetText: '0.4', exponentText: '1.6' }] }), { ...ctx, units: 'us' });
    if (!p.ok) throw new Error(JSON.stringify(p.errors));
    const h_ft = 2.5;
    expect(dischargeAt({ segments: p.segments }, h_ft * M_PER_FT) / M3S_PER_CFS).toBeCloseTo(30 * (2.5 - 0.4) ** 1.6, 9);
    expect(segmentTexts(p.segments, 'us')[0]).toEqual({ fromText: '0.4', coefficientText: '30', offsetText: '0.4', exponentText: '1.6' });
  });
  it('refuses non-numbers, negative coefficients and exponents, segments out of order, a future date, naming each field', () => {
    const p = parseRatingForm(
      form({
        validFromText: '2027-01-01T00:00',
        segments: [
          { fromText: '', coefficientText: '-2', offsetText: '0.1', exponentText: 'abc' },
          { fromText: '0.8', coefficientText: '5', offsetText: '0.3', exponentText: '-1' },
        ],
      }),
      ctx,
    );
    expect(p.ok).toBe(false);
    if (p.ok) return;
    const fields = p.errors.map((e) => e.field);
    expect(fields).toEqual(expect.arrayContaining(['validFrom', 'seg0-coefficient', 'seg0-exponent', 'seg1-exponent']));
    expect(p.errors.find((e) => e.field === 'seg0-exponent')!.text).toMatch(/must be a number.*“abc”/);
    const order = parseRatingForm(form({ segments: [{ fromText: '0.5', coefficientText: '5', offsetText: '0.1', exponentText: '2' }, { fromText: '0.4', coefficientText: '5', offsetText: '0.2', exponentText: '2' }] }), ctx);
    expect(order.ok ? [] : order.errors).toEqual([{ field: 'seg1-from', text: expect.stringMatching(/must start above segment 1/) }]);
    const high = parseRatingForm(form({ rangeLowText: '0.10', rangeHighText: '1' }), ctx);
    expect(high.ok ? [] : high.errors.map((e) => e.field)).toEqual(['seg0-offset']);
    // no message shows an internal name
    for (const e of p.errors) expect(e.text).not.toMatch(/_m\b|_ms\b|coefficient\s*\(/);
  });
  it('previews five stages across the gauged range; the continuity check flags a jump (not refused)', () => {
    expect(previewStages([{ fromStage_m: 0.1, offset_m: 0.1, coefficient: 5, exponent: 2 }], [0.2, 1.0])).toEqual([0.2, 0.4, 0.6000000000000001, 0.8, 1]);
    const two = parseRatingForm(form({ segments: [{ fromText: '', coefficientText: '5', offsetText: '0.1', exponentText: '2' }, { fromText: '0.8', coefficientText: '9', offsetText: '0.3', exponentText: '1.6' }] }), ctx);
    if (!two.ok) throw new Error('refused');
    // exact: 5·0.7² = 2.45 below, 9·0.5^1.6 = 2.969 above: a 21 % jump
    expect(ratingContinuity({ segments: two.segments }).breakpoints[0].jump_pct).toBeCloseTo((100 * (9 * 0.5 ** 1.6 - 2.45)) / 2.45, 10);
  });
});

describe('readValidFrom (the hand entry, the fit and the table import)', () => {
  it('reads a local time in the site zone, allows the minute being typed, refuses a later time and an unreadable one', () => {
    // Pacific/Auckland is UTC+12 in June (NZST; IANA tz database): 2026-06-01 12:00 local = 00:00 UTC.
    expect(readValidFrom('2026-06-01T12:00', ctx.timeZone, ctx.now_ms)).toEqual({ ok: true, validFrom_ms: ctx.now_ms });
    expect(readValidFrom('2026-06-01T12:01', ctx.timeZone, ctx.now_ms)).toEqual({ ok: true, validFrom_ms: ctx.now_ms + 60_000 });
    expect(readValidFrom('2026-06-01T12:02', ctx.timeZone, ctx.now_ms)).toEqual({ ok: false, problem: 'future' });
    expect(readValidFrom('June first', ctx.timeZone, ctx.now_ms)).toEqual({ ok: false, problem: 'unreadable' });
    // 2026-09-27 02:30 does not exist in Auckland (clocks go from 02:00 to 03:00; IANA tz database).
    expect(readValidFrom('2026-09-27T02:30', ctx.timeZone, Date.UTC(2027, 0, 1))).toEqual({ ok: false, problem: 'unreadable' });
  });
});
