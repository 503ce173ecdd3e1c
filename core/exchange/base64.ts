// Base64 (RFC 4648 §4, the standard alphabet with "=" padding) in plain TypeScript, for photo bytes inside
// bundle files. Decoding is strict: no line breaks or other characters outside the alphabet, padding only
// at the end and only as much as the length needs, and unused bits zero (the canonical encoding, §3.5),
// so one byte string has exactly one text.

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
const VALUE = new Int16Array(128).fill(-1);
for (let i = 0; i < ALPHABET.length; i++) VALUE[ALPHABET.charCodeAt(i)] = i;

/** The standard base64 text of `bytes` (RFC 4648 §4, padded, no line breaks). */
export function base64Encode(bytes: Uint8Array): string {
  let out = '';
  let i = 0;
  for (; i + 2 < bytes.length; i += 3) {
    const n = (bytes[i] << 16) | (bytes[i + 1] << 8) | bytes[i + 2];
    out += ALPHABET[n >> 18] + ALPHABET[(n >> 12) & 63] + ALPHABET[(n >> 6) & 63] + ALPHABET[n & 63];
  }
  const rest = bytes.length - i;
  if (rest === 1) {
    const n = bytes[i] << 16;
    out += ALPHABET[n >> 18] + ALPHABET[(n >> 12) & 63] + '==';
  } else if (rest === 2) {
    const n = (bytes[i] << 16) | (bytes[i + 1] << 8);
    out += ALPHABET[n >> 18] + ALPHABET[(n >> 12) & 63] + ALPHABET[(n >> 6) & 63] + '=';
  }
  return out;
}

/** How many bytes a base64 text of this length and padding decodes to (no check of its characters). */
export function base64DecodedLength(text: string): number {
  const pad = text.endsWith('==') ? 2 : text.endsWith('=') ? 1 : 0;
  return Math.max(0, (text.length / 4) * 3 - pad);
}

/** The bytes of a standard base64 text; a RangeError says what is wrong with any text that is not canonical base64. */
export function base64Decode(text: string): Uint8Array {
  if (text.length % 4 !== 0) {
    throw new RangeError(`Base64 text comes in groups of 4 characters; this one has ${text.length} characters.`);
  }
  const pad = text.endsWith('==') ? 2 : text.endsWith('=') ? 1 : 0;
  const out = new Uint8Array(base64DecodedLength(text));
  let o = 0;
  for (let i = 0; i < text.length; i += 4) {
    const last = i + 4 === text.length;
    let n = 0;
    for (let j = 0; j < 4; j++) {
      const c = text.charCodeAt(i + j);
      const isPad = c === 61 && last && j >= 4 - pad;
      const v = isPad ? 0 : c < 128 ? VALUE[c] : -1;
      if (v < 0) throw new RangeError(`Base64 text holds ${describeChar(c)} at character ${i + j + 1}, which is not in the standard alphabet.`);
      n = (n << 6) | v;
    }
    out[o++] = n >> 16;
    if (o < out.length) out[o++] = (n >> 8) & 255;
    if (o < out.length) out[o++] = n & 255;
    if (last && ((pad === 1 && (n & 0xff) !== 0) || (pad === 2 && (n & 0xffff) !== 0))) {
      throw new RangeError('Base64 text ends with bits that belong to no byte (it is not the standard encoding of any bytes).');
    }
  }
  return out;
}

function describeChar(c: number): string {
  if (c === 61) return '"=" (padding, allowed only at the end)';
  if (c === 10 || c === 13) return 'a line break';
  if (c === 32) return 'a space';
  if (c < 32 || c === 127) return `a control character (U+${c.toString(16).toUpperCase().padStart(4, '0')})`;
  return JSON.stringify(String.fromCharCode(c));
}
