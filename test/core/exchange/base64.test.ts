// Base64 for photo bytes in bundle files: RFC 4648 §10 test vectors, Node's Buffer as an oracle on random
// bytes, and the strict decoder's refusals (RFC 4648 §3.3 characters outside the alphabet, §3.5 canonical
// encoding: pad bits zero).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { base64Decode, base64DecodedLength, base64Encode } from '../../../core/index';

const ascii = (s: string) => new TextEncoder().encode(s);

describe('base64', () => {
  // RFC 4648 §10, "Test Vectors" (BASE64).
  it.each([
    ['', ''], ['f', 'Zg=='], ['fo', 'Zm8='], ['foo', 'Zm9v'], ['foob', 'Zm9vYg=='], ['fooba', 'Zm9vYmE='], ['foobar', 'Zm9vYmFy'],
  ])('encodes %j as %j and back (RFC 4648 §10)', (plain, encoded) => {
    expect(base64Encode(ascii(plain))).toBe(encoded);
    expect(Array.from(base64Decode(encoded))).toEqual(Array.from(ascii(plain)));
    expect(base64DecodedLength(encoded)).toBe(plain.length);
  });

  it('agrees with Node\'s Buffer on any bytes, both ways (oracle: node:buffer)', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 400 }), (bytes) => {
        const text = Buffer.from(bytes).toString('base64');
        expect(base64Encode(bytes)).toBe(text);
        expect(Buffer.from(base64Decode(text)).equals(Buffer.from(bytes))).toBe(true);
      }),
      { numRuns: 300 },
    );
  });

  it('uses the whole alphabet, + and / included (oracle: node:buffer)', () => {
    const bytes = new Uint8Array(256).map((_, i) => i);
    const text = base64Encode(bytes);
    expect(text).toBe(Buffer.from(bytes).toString('base64'));
    expect(text).toMatch(/\+/);
    expect(text).toMatch(/\//);
  });

  it.each([
    ['Zg=', /groups of 4/],
    ['Zm9v\nYg==', /groups of 4/],
    ['Zm9\nYg==', /line break at character 4/],
    ['Zm 9', /space at character 3/],
    ['Zm9v-_==', /"-" at character 5/],
    ['Zg=a', /padding, allowed only at the end/],
    ['Z===', /padding/],
    ['Zm8=Zm8=', /padding/],
    // RFC 4648 §3.5: "Zh==" decodes to "f" only by ignoring set pad bits; the canonical text is "Zg==".
    ['Zh==', /bits that belong to no byte/],
    ['Zm9=', /bits that belong to no byte/],
    ['Zmé=', /"é" at character 3/],
  ])('refuses %j', (text, why) => {
    expect(() => base64Decode(text)).toThrow(why);
  });
});
