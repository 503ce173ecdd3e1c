// The checksum's test vector (core/exchange/test-vectors/checksum-1.json) checked both ways: this project's
// code gives the vector's canonical text and checksum, and so does a second canonicaliser written here
// from the words of the protocol page alone (core/exchange/README.md, "The checksum"), with its own JSON
// reader that keeps each number's spelling and node:crypto's SHA-256 (FIPS 180-4) as the oracle digest.
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { bundleChecksum, parseBundle, type SyncRecord } from '../../../core/index';

const vector = JSON.parse(readFileSync(new URL('../../../core/exchange/test-vectors/checksum-1.json', import.meta.url), 'utf8')) as {
  document: string; canonical: string; checksum: string;
};

// ---- the second canonicaliser, from the page's rules ----

/** A number's canonical text from its spelling in a document (page: shortest round-trip digits, four layouts). */
function canonicalNumber(spelling: string): string {
  const x = Number(spelling);
  if (!Number.isFinite(x)) throw new RangeError(`not a finite number: ${spelling}`);
  if (x === 0) return '0';
  const sign = x < 0 ? '-' : '';
  const a = Math.abs(x);
  // Fewest significant digits that read back as the same double: try 1, 2, … 17 digits.
  let digits = '';
  let n = 0;
  for (let k = 1; k <= 17; k++) {
    const [mantissa, exp] = a.toExponential(k - 1).split('e');
    if (Number(`${mantissa}e${exp}`) === a) {
      digits = mantissa.replace('.', '').replace(/0+$/, '') || '0';
      n = Number(exp) + 1; // value = 0.d1…dk × 10^n
      break;
    }
  }
  const k = digits.length;
  if (k <= n && n <= 21) return sign + digits + '0'.repeat(n - k);
  if (0 < n && n <= 21) return sign + digits.slice(0, n) + '.' + digits.slice(n);
  if (-6 < n && n <= 0) return sign + '0.' + '0'.repeat(-n) + digits;
  const e = n - 1;
  return sign + digits[0] + (k > 1 ? '.' + digits.slice(1) : '') + 'e' + (e > 0 ? '+' : '-') + Math.abs(e);
}

/** A string's canonical text (page: escape " \ and the characters below U+0020 and lone surrogates only). */
function canonicalString(s: string): string {
  const short: Record<number, string> = { 0x22: '\\"', 0x5c: '\\\\', 0x08: '\\b', 0x09: '\\t', 0x0a: '\\n', 0x0c: '\\f', 0x0d: '\\r' };
  let out = '"';
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    const pairHigh = c >= 0xd800 && c <= 0xdbff && i + 1 < s.length && s.charCodeAt(i + 1) >= 0xdc00 && s.charCodeAt(i + 1) <= 0xdfff;
    if (pairHigh) {
      out += s[i] + s[i + 1];
      i++;
    } else if (short[c] !== undefined) out += short[c];
    else if (c < 0x20 || (c >= 0xd800 && c <= 0xdfff)) out += '\\u' + c.toString(16).padStart(4, '0');
    else out += s[i];
  }
  return out + '"';
}

/** Reads JSON text and writes it back canonically, keeping key order and reading numbers from their spelling. */
function canonicalJson(text: string): { value: string; records?: string } {
  let i = 0;
  let records: string | undefined;
  const ws = () => {
    while (/[ \t\n\r]/.test(text[i] ?? '')) i++;
  };
  const readString = (): string => {
    let s = '';
    i++; // opening quote
    for (;;) {
      const ch = text[i++];
      if (ch === '"') return s;
      if (ch !== '\\') {
        s += ch;
        continue;
      }
      const e = text[i++];
      const simple: Record<string, string> = { '"': '"', '\\': '\\', '/': '/', b: '\b', f: '\f', n: '\n', r: '\r', t: '\t' };
      if (e === 'u') {
        s += String.fromCharCode(parseInt(text.slice(i, i + 4), 16));
        i += 4;
      } else s += simple[e];
    }
  };
  const value = (depth: number, key?: string): string => {
    ws();
    const ch = text[i];
    let out: string;
    if (ch === '{') {
      i++;
      const members: string[] = [];
      ws();
      while (text[i] !== '}') {
        ws();
        const k = readString();
        ws();
        i++; // colon
        members.push(`${canonicalString(k)}:${value(depth + 1, depth === 0 ? k : undefined)}`);
        ws();
        if (text[i] === ',') i++;
        ws();
      }
      i++;
      out = `{${members.join(',')}}`;
    } else if (ch === '[') {
      i++;
      const items: string[] = [];
      ws();
      while (text[i] !== ']') {
        items.push(value(depth + 1));
        ws();
        if (text[i] === ',') i++;
        ws();
      }
      i++;
      out = `[${items.join(',')}]`;
    } else if (ch === '"') out = canonicalString(readString());
    else {
      const m = /^(true|false|null|-?\d+(\.\d+)?([eE][+-]?\d+)?)/.exec(text.slice(i));
      if (!m) throw new SyntaxError(`unexpected ${ch} at ${i}`);
      i += m[0].length;
      out = /^[tfn]/.test(m[0]) ? m[0] : canonicalNumber(m[0]);
    }
    if (key === 'records') records = out;
    return out;
  };
  return { value: value(0), records };
}

describe('the checksum test vector (core/exchange/test-vectors/checksum-1.json)', () => {
  it('is produced by the project\'s code: canonical text and checksum, and the bundle passes every check', () => {
    const bundle = parseBundle(JSON.parse(vector.document));
    expect(JSON.stringify(bundle.records)).toBe(vector.canonical);
    expect(bundleChecksum(bundle.records as SyncRecord[])).toBe(vector.checksum);
    expect(bundle.checksum).toBe(vector.checksum);
  });

  it('is produced by a canonicaliser written from the protocol page alone, with node:crypto\'s SHA-256', () => {
    const { records } = canonicalJson(vector.document);
    expect(records).toBe(vector.canonical);
    const digest = createHash('sha256').update(Buffer.from(records as string, 'utf8')).digest('hex');
    expect(`sha256:${digest}`).toBe(vector.checksum);
  });

  it('really tests the rules: the document spells numbers and strings otherwise than the canonical text', () => {
    for (const spelling of ['1E3', '-0', '1.0', '2.5E-1', '123456789012345678901', '-12.50', '\\/', '\\u00e9', '\\ud83c\\udf0a']) {
      expect(vector.document).toContain(spelling);
    }
    for (const canonical of ['1000', '1e+21', '1e-7', '0.000001', '123456789012345680000', '5e-324', '1.7976931348623157e+308', '-12.5', '0.25', 'café 🌊']) {
      expect(vector.canonical).toContain(canonical);
    }
  });

  // Number::toString examples (ECMA-262 §6.1.6.1.20), checked against the page's four layouts.
  it.each([
    ['0.1', '0.1'], ['100', '100'], ['1e21', '1e+21'], ['1e20', '100000000000000000000'], ['0.0000001', '1e-7'], ['0.000001', '0.000001'],
    ['1.5e300', '1.5e+300'], ['-3.25e-10', '-3.25e-10'], ['0.30000000000000004', '0.30000000000000004'], ['4.35', '4.35'],
  ])('writes %s as %s, as JavaScript does', (spelling, canonical) => {
    expect(canonicalNumber(spelling)).toBe(canonical);
    expect(JSON.stringify(Number(spelling))).toBe(canonical);
  });

  it('escapes strings as the page says, as JavaScript does (well-formed JSON.stringify, ES2019)', () => {
    for (const s of ['\u0000\u0001\u001f', '\b\f\n\r\t', '"\\/', '\ud800 lone', 'lone \udfff', '\u2028\u2029\u007f', '😀']) {
      expect(canonicalString(s)).toBe(JSON.stringify(s));
    }
  });
});
