// Logger records as per-site, per-UTC-day records: cutting, merging without doubling, reading back,
// the name-based id, and the record validator. Values are invented; ids follow RFC 9562's layout
// (version 8 in the 13th hex digit, variant 10xx in the 17th).
import { describe, expect, it } from 'vitest';
import { isUuid, loggerDayId, loggerDayStages, mergeLoggerDay, RecordValidationError, splitLoggerDays, validateLoggerDayBody, validateSyncRecord } from '../../core';

const DAY = 86_400_000;
const D0 = Date.UTC(2026, 2, 1) / DAY; // UTC day index of 1 March 2026
const T0 = D0 * DAY;
const Q = 15 * 60_000;
const context = { siteId: 'site-a', fileName: 'kc01.csv', checks: [{ time_ms: T0 + Q, staff_m: 0.52, logger_m: 0.5 }] };

describe('cutting a record into days', () => {
  it('puts each value in its UTC day with its offset from midnight, raw and correction kept apart', () => {
    const time_ms = [T0 + DAY - Q, T0 + DAY, T0 + DAY + Q]; // 23:45 on day 0, 00:00 and 00:15 on day 1
    const days = splitLoggerDays({ time_ms, raw_m: [0.5, 0.6, 0.7], correction_m: [0.01, 0.02, 0.03] }, context);
    expect(days.map((d) => d.day)).toEqual([D0, D0 + 1]);
    expect(days[0].offset_ms).toEqual([DAY - Q]);
    expect(days[1].offset_ms).toEqual([0, Q]);
    expect(days[1].raw_m).toEqual([0.6, 0.7]);
    expect(days[1].correction_m).toEqual([0.02, 0.03]);
    expect(days[1].checks).toEqual(context.checks);
    const back = loggerDayStages(days[1]);
    expect(Array.from(back.time_ms)).toEqual([T0 + DAY, T0 + DAY + Q]);
    expect(back.stage_m[0]).toBeCloseTo(0.62, 12);
    expect(Array.from(back.raw_m)).toEqual([0.6, 0.7]);
    for (const d of days) validateLoggerDayBody(d);
  });

  // The text rule (core/records/text.ts): U+0000 and U+001F are Unicode controls (Cc), U+DC00 alone is half a
  // UTF-16 pair (Unicode §3.9 D91; RFC 8259 §8.2). A file name is cleaned, so the import goes on.
  it('cleans a file name holding NUL, U+001F or a lone surrogate, and the day then passes validation', () => {
    const [day] = splitLoggerDays({ time_ms: [T0 + Q], raw_m: [0.5], correction_m: [0] }, { ...context, fileName: 'kc\u000001\u001f \udc00.csv' });
    expect(day.fileName).toBe('kc01 \ufffd.csv');
    validateLoggerDayBody(day);
    expect(() => validateLoggerDayBody({ ...day, note: 'bad \u0000' })).toThrow(RecordValidationError);
  });

  it('refuses times out of order or mismatched lengths', () => {
    expect(() => splitLoggerDays({ time_ms: [T0 + Q, T0], raw_m: [1, 1], correction_m: [0, 0] }, context)).toThrow(/ascending/);
    expect(() => splitLoggerDays({ time_ms: [T0], raw_m: [1, 1], correction_m: [0] }, context)).toThrow(/one raw value/);
  });
});

describe('merging a day already stored', () => {
  const [stored] = splitLoggerDays({ time_ms: [T0, T0 + Q, T0 + 2 * Q], raw_m: [1, 2, 3], correction_m: [0, 0, 0] }, context);
  it('adds new times in order and reports the times already held, keeping the stored values', () => {
    const [incoming] = splitLoggerDays({ time_ms: [T0 + Q, T0 + 1.5 * Q, T0 + 3 * Q], raw_m: [9, 8, 7], correction_m: [1, 1, 1] }, { ...context, fileName: 'second.csv' });
    const { body, repeated_ms } = mergeLoggerDay(stored, incoming);
    expect(repeated_ms).toEqual([T0 + Q]);
    expect(body.offset_ms).toEqual([0, Q, 1.5 * Q, 2 * Q, 3 * Q]);
    expect(body.raw_m).toEqual([1, 2, 8, 3, 7]);
    expect(body.correction_m).toEqual([0, 0, 1, 0, 1]);
    expect(body.fileName).toBe('second.csv');
  });
  it('returns the stored day itself when the incoming one adds nothing', () => {
    const { body, repeated_ms } = mergeLoggerDay(stored, stored);
    expect(body).toBe(stored);
    expect(repeated_ms).toEqual([T0, T0 + Q, T0 + 2 * Q]);
  });
});

describe('the record id of a site-day', () => {
  it('is a lower-case UUID, the same for the same site and day, different otherwise', () => {
    const id = loggerDayId('site-a', D0);
    expect(isUuid(id)).toBe(true);
    expect(id[14]).toBe('8');
    expect(['8', '9', 'a', 'b']).toContain(id[19]);
    expect(loggerDayId('site-a', D0)).toBe(id);
    const others = new Set([id, loggerDayId('site-a', D0 + 1), loggerDayId('site-b', D0), loggerDayId('site-a', D0 - 1)]);
    expect(others.size).toBe(4);
  });
});

describe('the logger-day validator', () => {
  const good = () => splitLoggerDays({ time_ms: [T0, T0 + Q], raw_m: [0.5, 0.6], correction_m: [0, 0.01] }, context)[0];
  it.each([
    ['offset_ms[1]', (b: Record<string, unknown>) => (b.offset_ms = [0, 0])],
    ['offset_ms[1]', (b: Record<string, unknown>) => (b.offset_ms = [0, DAY])],
    ['raw_m', (b: Record<string, unknown>) => (b.raw_m = [0.5])],
    ['raw_m[0]', (b: Record<string, unknown>) => (b.raw_m = [Number.NaN, 0.6])],
    ['correction_m[1]', (b: Record<string, unknown>) => (b.correction_m = [0, 11])],
    ['checks[0].staff_m', (b: Record<string, unknown>) => (b.checks = [{ time_ms: T0, staff_m: 'x', logger_m: 1 }])],
    ['day', (b: Record<string, unknown>) => (b.day = 1.5)],
  ])('names %s when it is wrong', (field, spoil) => {
    const b = good() as unknown as Record<string, unknown>;
    spoil(b);
    try {
      validateLoggerDayBody(b);
      expect.unreachable('accepted a bad logger day');
    } catch (e) {
      expect(e).toBeInstanceOf(RecordValidationError);
      expect((e as RecordValidationError).field).toBe(field);
    }
  });
  it('travels as a sync record of kind logger-day', () => {
    const body = { ...good(), updated_ms: T0 };
    expect(() => validateSyncRecord({ kind: 'logger-day', id: loggerDayId('site-a', D0), rev: '1767225600000-000000-abcd', body })).not.toThrow();
  });
});

describe('a check reading', () => {
  it('keeps the logger value beside a staff reading, and a logger reading cannot be a check', async () => {
    const { validateReadingBody } = await import('../../core');
    const r = { siteId: 's', time_ms: T0, stage_m: 0.52, source: 'staff', quality: 'good', observer: '', note: '', warnings: [], loggerCheck: { logger_m: 0.5 } };
    expect(() => validateReadingBody(r)).not.toThrow();
    expect(() => validateReadingBody({ ...r, source: 'logger' })).toThrow(/other than the logger/);
    expect(() => validateReadingBody({ ...r, loggerCheck: { logger_m: 'x' } })).toThrow(/loggerCheck.logger_m/);
  });
});
