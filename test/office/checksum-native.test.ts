// The office receiver checks bundle checksums with Node's native SHA-256 (http.ts nodeSha256); it must give
// exactly the checksum core gives (core/exchange/sha256.ts, FIPS 180-4) for the same records. Checked on
// the published test vector (core/exchange/test-vectors/checksum-1.json, its stated checksum), on the
// FIPS 180-2 Appendix B examples ("abc" and the 448-bit message), and on text with multi-byte UTF-8 and a
// lone surrogate (both sides write U+FFFD for it, as the WHATWG Encoding Standard's UTF-8 encoder does).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { BundleError, bundleChecksum, parseBundle, type SyncRecord } from '../../core/index';
import { nodeSha256 } from '../../office/receiver/http';

const vector = JSON.parse(readFileSync(new URL('../../core/exchange/test-vectors/checksum-1.json', import.meta.url), 'utf8')) as {
  document: string; checksum: string;
};

describe("the receiver's native checksum", () => {
  it('gives the FIPS 180-2 example digests', () => {
    // FIPS 180-2, Appendix B.1 and B.2.
    expect(nodeSha256('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(nodeSha256('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe('248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1');
  });

  it("accepts the test vector's bundle with its stated checksum, as core does", () => {
    const bundle = parseBundle(JSON.parse(vector.document), nodeSha256);
    expect(bundle.checksum).toBe(vector.checksum);
    expect(bundleChecksum(bundle.records, nodeSha256)).toBe(bundleChecksum(bundle.records));
  });

  it('agrees with core on multi-byte text and a lone surrogate, and refuses a damaged bundle alike', () => {
    const records = [{ kind: 'x', id: 'é 水 🌊', rev: '\ud800 lone', body: {} }] as unknown as SyncRecord[];
    expect(bundleChecksum(records, nodeSha256)).toBe(bundleChecksum(records));
    const damaged = JSON.parse(vector.document) as { records: { body: Record<string, unknown> }[] };
    damaged.records[0].body.name = 'changed';
    expect(() => parseBundle(damaged, nodeSha256)).toThrow(BundleError);
    expect(() => parseBundle(damaged)).toThrow(BundleError);
  });
});
