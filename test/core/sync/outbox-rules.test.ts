// The outbox's pure rules: bundle bytes measured as UTF-8 (oracle: Node's Buffer.byteLength, RFC 3629),
// packing whole records under a budget (oracle: the length of the bundle's own JSON), the stated limit
// header, and reading a refused push (RFC 9110 §15.5.1 400, §15.5.14 413; the receiver's JSON answer).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  bundleBudget, DEFAULT_BUNDLE_BYTES, formatRev, makeBundle, MIN_BUNDLE_BYTES, readRefusal, recordsThatFit, statedLimit_bytes, utf8Length,
  type SyncRecord,
} from '../../../core/index';
import { reading } from '../../support/records';

const SITE = '11111111-1111-4111-8111-111111111111';
function rec(i: number, note: string): SyncRecord {
  return {
    kind: 'reading', id: `22222222-2222-4222-8222-${String(i).padStart(12, '0')}`, rev: formatRev({ wall_ms: 1_700_000_000_000 + i, counter: 0, deviceId: 'phone-a' }),
    body: { ...reading(SITE, 1_700_000_000_000 + i, 1), note, updated_ms: 1_700_000_000_000 },
  } as SyncRecord;
}

describe('utf8Length', () => {
  it('counts UTF-8 bytes as Node does for well-formed text (1–4 bytes a character, RFC 3629 §3)', () => {
    expect(utf8Length('a')).toBe(1);
    expect(utf8Length('å')).toBe(2); // U+00E5
    expect(utf8Length('水')).toBe(3); // U+6C34
    expect(utf8Length('\ud83c\udf0a')).toBe(4); // U+1F30A
    fc.assert(fc.property(fc.string({ unit: 'grapheme', maxLength: 80 }), (s) => {
      expect(utf8Length(s)).toBe(Buffer.byteLength(s, 'utf8'));
    }), { numRuns: 500 });
  });
});

describe('packing records by bytes', () => {
  it('fills a bundle as far as its JSON stays within the budget, and the next record would pass it', () => {
    fc.assert(
      fc.property(fc.array(fc.string({ unit: 'grapheme', maxLength: 400 }), { minLength: 1, maxLength: 25 }), fc.integer({ min: 600, max: 6000 }), (notes, budget) => {
        const records = notes.map((n, i) => rec(i, n));
        const empty = makeBundle({ id: '33333333-3333-4333-8333-333333333333', device: 'phone-a', created_ms: 0, records: [] });
        const sizes = records.map((r) => utf8Length(JSON.stringify(r)));
        const n = recordsThatFit(sizes, utf8Length(JSON.stringify(empty)), budget, 500);
        const bytesOf = (k: number) => Buffer.byteLength(JSON.stringify(makeBundle({ id: empty.id, device: 'phone-a', created_ms: 0, records: records.slice(0, k) })), 'utf8');
        expect(n).toBeGreaterThanOrEqual(1);
        if (n > 1) expect(bytesOf(n)).toBeLessThanOrEqual(budget);
        if (n < records.length) expect(bytesOf(n + 1)).toBeGreaterThan(budget);
      }),
      { numRuns: 200 },
    );
  });

  it('sends a record larger than the budget alone, and keeps to the record count cap', () => {
    expect(recordsThatFit([10_000, 10, 10], 300, 1000, 500)).toBe(1);
    expect(recordsThatFit([10, 10, 10], 300, 1000, 2)).toBe(2);
    expect(recordsThatFit([], 300, 1000, 500)).toBe(0);
  });

  it('keeps the budget at 4 MiB, ¾ of a stated limit, a lowered budget, and a lowered one never under 1 KiB', () => {
    expect(bundleBudget({})).toBe(DEFAULT_BUNDLE_BYTES);
    expect(bundleBudget({ stated_bytes: 16 * 1024 * 1024 })).toBe(DEFAULT_BUNDLE_BYTES);
    expect(bundleBudget({ stated_bytes: 1024 * 1024 })).toBe(786_432);
    expect(bundleBudget({ lowered_bytes: 200_000 })).toBe(200_000);
    expect(bundleBudget({ lowered_bytes: 10 })).toBe(MIN_BUNDLE_BYTES);
    expect(MIN_BUNDLE_BYTES).toBe(1024);
    expect(bundleBudget({ stated_bytes: 4096, lowered_bytes: 100_000 })).toBe(3072);
  });

  it('reads the stated limit header as whole bytes from 1 KiB, ignoring anything else', () => {
    expect(statedLimit_bytes('16777216')).toBe(16_777_216);
    expect(statedLimit_bytes(' 2097152 ')).toBe(2_097_152);
    for (const bad of [null, undefined, '', '16 MiB', '-5', '1e7', '100']) expect(statedLimit_bytes(bad)).toBeUndefined();
  });
});

describe('readRefusal', () => {
  const json = 'application/json; charset=utf-8';
  const answer = (status: number, body: unknown, contentType: string | null = json) => ({ status, contentType, body: typeof body === 'string' ? body : JSON.stringify(body), retryAfter: null });

  it('finds the record a 400 "record" answer names: by index, by position, or by the bundle check\'s message', () => {
    expect(readRefusal(answer(400, { error: 'record', index: 2, message: 'no' }), 5)).toEqual({ kind: 'record', index: 2, message: 'no' });
    expect(readRefusal(answer(400, { reason: 'record', position: 3, message: 'no' }), 5)).toMatchObject({ kind: 'record', index: 2 });
    expect(readRefusal(answer(400, { error: 'record', message: 'Record 4 of the bundle holds text that cannot be stored: …' }), 5)).toMatchObject({ kind: 'record', index: 3 });
  });

  it('asks for a search when a record refusal names no record, or names one outside the bundle', () => {
    expect(readRefusal(answer(400, { error: 'record', message: 'bad' }), 5)).toEqual({ kind: 'record', message: 'bad' });
    expect(readRefusal(answer(400, { error: 'record', index: 9, message: 'x' }), 5)).toEqual({ kind: 'record', message: 'x' });
    expect(readRefusal(answer(422, { message: 'x' }), 5)).toEqual({ kind: 'record', message: 'x' });
  });

  it('leaves token, address, whole-bundle faults, non-JSON answers and retries to the other rules', () => {
    expect(readRefusal(answer(401, { error: 'token-unknown' }), 5)).toBeUndefined();
    expect(readRefusal(answer(403, { error: 'token-revoked' }), 5)).toBeUndefined();
    expect(readRefusal(answer(404, { error: 'path' }), 5)).toBeUndefined();
    expect(readRefusal(answer(400, { error: 'checksum', message: 'damaged' }), 5)).toBeUndefined();
    expect(readRefusal(answer(400, { error: 'json' }), 5)).toBeUndefined();
    expect(readRefusal(answer(400, '<html>Bad Request</html>', 'text/html'), 5)).toBeUndefined();
    expect(readRefusal(answer(503, { error: 'server' }), 5)).toBeUndefined();
    expect(readRefusal(answer(201, { bundle: 'x' }), 5)).toBeUndefined();
  });

  it('reads 413 as too large, with the stated limit when the header gives one', () => {
    expect(readRefusal(answer(413, { error: 'size', message: 'too big' }), 5, '8388608')).toEqual({ kind: 'too-large', limit_bytes: 8_388_608, message: 'too big' });
    expect(readRefusal(answer(413, '', null), 5)).toEqual({ kind: 'too-large', message: 'The office refused the bundle as too large.' });
  });
});
