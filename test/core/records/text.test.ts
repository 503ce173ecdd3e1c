// The text rule against the Unicode code charts and RFC 8259: Unicode's general category Cc is
// U+0000–U+001F and U+007F–U+009F (Unicode Standard §4.5, General Category; UnicodeData.txt); U+D800–U+DBFF
// and U+DC00–U+DFFF are surrogate code units that form a character only as a high–low pair (Unicode
// Standard §3.9, D91 UTF-16), and RFC 8259 §8.2 says a string holding a lone one may behave unpredictably.
// Node's own well-formedness test (String.prototype.isWellFormed, ECMAScript 2024) is an oracle.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { BundleError, formatRev, cleanText, jsonTextProblem, makeBundle, parseBundle, textProblem, textRefusal, validateReadingBody, RecordValidationError } from '../../../core/index';
import { reading } from '../../support/records';

describe('textProblem', () => {
  it.each([
    ['logger export \u0000\u0000 junk', 15, 0x0000, 'nul'], // U+0000 NUL (Cc)
    ['unit\u001fseparator', 5, 0x001f, 'control'], // U+001F INFORMATION SEPARATOR ONE (Cc)
    ['bell\u0007', 5, 0x0007, 'control'], // U+0007 BELL (Cc)
    ['del\u007f', 4, 0x007f, 'control'], // U+007F DELETE (Cc)
    ['c1\u0085', 3, 0x0085, 'control'], // U+0085 NEXT LINE (Cc, C1 block)
    ['lone high \ud800 here', 11, 0xd800, 'lone-surrogate'], // high surrogate with no low one after it
    ['lone low \udc00', 10, 0xdc00, 'lone-surrogate'], // low surrogate with no high one before it
    ['reversed \udf0a\ud83c', 10, 0xdf0a, 'lone-surrogate'], // a pair in the wrong order is two lone halves
    ['bare CR\rhere', 8, 0x000d, 'control'], // CR outside CR LF
  ])('finds the first refused code unit in %j', (text, position, codeUnit, what) => {
    expect(textProblem(text)).toEqual({ position, codeUnit, what });
  });

  it.each([
    'tab\tand\nnew line', // U+0009 and U+000A are the two controls kept
    'Windows line\r\nend', // CR only as part of CR LF
    'wave \ud83c\udf0a', // U+1F30A WATER WAVE as the UTF-16 pair D83C DF0A
    'Ångström, 水位, ∑ m³/s', // ordinary letters and symbols outside ASCII
    '\u00a0no-break space', // U+00A0 is not Cc (category Zs)
    '',
  ])('keeps %j', (text) => {
    expect(textProblem(text)).toBeUndefined();
  });

  it('accepts exactly the well-formed strings without refused controls (oracle: String.prototype.isWellFormed)', () => {
    const controls = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]|\r(?!\n)/;
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 40 }), (s) => {
        const expected = (s as string & { isWellFormed(): boolean }).isWellFormed() && !controls.test(s);
        expect(textProblem(s) === undefined).toBe(expected);
      }),
      { numRuns: 2000 },
    );
  });
});

describe('cleanText', () => {
  it('removes controls, turns CR LF into LF and lone halves into U+FFFD, and keeps pairs', () => {
    expect(cleanText('a\u0000b\u001fc\r\nd\re \ud800 \ud83c\udf0a')).toEqual({ text: 'abc\nd\ne \ufffd \ud83c\udf0a', changed: 5 });
    expect(cleanText('fine\ttext\n')).toEqual({ text: 'fine\ttext\n', changed: 0 });
  });

  it('always gives text the rule accepts (property)', () => {
    fc.assert(fc.property(fc.string({ unit: 'binary', maxLength: 60 }), (s) => {
      expect(textProblem(cleanText(s).text)).toBeUndefined();
    }), { numRuns: 1000 });
  });

  it('gives a plain sentence naming the character and its position', () => {
    expect(textRefusal('the note', 'ab\u0000')).toBe('The note holds a NUL character (U+0000) at character 3; remove it and try again.');
    expect(textRefusal('the note', 'ok')).toBeUndefined();
  });
});

describe('text rule in record validation and bundle checks', () => {
  const site = '11111111-1111-4111-8111-111111111111';
  it('refuses a reading note with a NUL, naming the field', () => {
    const body = reading(site, 1_700_000_000_000, 1.2, { note: 'logger export \u0000\u0000 junk' });
    try {
      validateReadingBody(body);
      expect.unreachable('a NUL in a note must be refused');
    } catch (e) {
      expect(e).toBeInstanceOf(RecordValidationError);
      expect((e as RecordValidationError).field).toBe('note');
      expect((e as Error).message).toMatch(/NUL character \(U\+0000\) at character 15/);
    }
  });

  it('finds a bad string anywhere in a JSON value, field names included', () => {
    expect(jsonTextProblem({ a: [1, 'ok', { b: 'x\ud800' }] })?.path).toBe('a[2].b');
    expect(jsonTextProblem({ 'bad\u0001key': 1 })?.problem.codeUnit).toBe(1);
    expect(jsonTextProblem({ a: ['\ud83c\udf0a'] })).toBeUndefined();
  });

  it.each([
    ['a NUL', 'logger export \u0000 junk', /NUL character \(U\+0000\)/],
    ['U+001F', 'sep\u001f', /control character \(U\+001F\)/],
    ['a lone U+D800', 'half \ud800', /\(U\+D800\)/],
  ])('refuses a bundle whose second record holds %s, naming record 2', (_name, note, words) => {
    const rec = (i: number, n: string) => ({
      kind: 'reading' as const,
      id: `2222222${i}-2222-4222-8222-222222222222`,
      rev: formatRev({ wall_ms: 1_700_000_000_000, counter: 0, deviceId: `phone-${i}` }),
      body: { ...reading(site, 1_700_000_000_000 + i, 1, { note: n }), updated_ms: 1_700_000_000_000 },
    });
    const records = [rec(1, 'fine'), rec(2, note), rec(3, 'fine')];
    const bundle = makeBundle({ id: '33333333-3333-4333-8333-333333333333', device: 'dev', created_ms: 0, records: records as never });
    try {
      parseBundle(JSON.parse(JSON.stringify(bundle)));
      expect.unreachable('the bundle must be refused');
    } catch (e) {
      expect(e).toBeInstanceOf(BundleError);
      expect((e as BundleError).reason).toBe('record');
      expect((e as BundleError).recordIndex).toBe(1);
      expect((e as Error).message).toMatch(/^Record 2 of the bundle/);
      expect((e as Error).message).toMatch(words);
    }
  });

  it('keeps a bundle whose note holds U+1F30A (a valid pair)', () => {
    const records = [{ kind: 'reading' as const, id: '22222221-2222-4222-8222-222222222222', rev: formatRev({ wall_ms: 1_700_000_000_000, counter: 0, deviceId: 'phone-1' }), body: { ...reading(site, 1_700_000_000_000, 1, { note: 'wave \ud83c\udf0a' }), updated_ms: 1_700_000_000_000 } }];
    const bundle = makeBundle({ id: '33333333-3333-4333-8333-333333333333', device: 'dev', created_ms: 0, records: records as never });
    expect(parseBundle(JSON.parse(JSON.stringify(bundle))).records[0]).toEqual(records[0]);
  });
});
