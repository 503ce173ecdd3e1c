// The bundle format: SHA-256 against the FIPS 180-2 examples and Node's crypto as an oracle; bundles made,
// read back and refused for each kind of damage.
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  BundleError, bundleChecksum, makeBundle, parseBundle, sha256Hex, utf8Bytes, formatRev, type SyncRecord,
} from '../../../core/index';

const hex = (s: string) => sha256Hex(utf8Bytes(s));

describe('sha256Hex', () => {
  it.each([
    // FIPS 180-2, appendix B.1 (one-block message "abc")
    ['abc', 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'],
    // FIPS 180-2, appendix B.2 (multi-block message, 448 bits)
    ['abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq', '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1'],
    // Empty message: the widely published digest of zero bytes (from memory; also checked by the oracle below)
    ['', 'e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855'],
  ])('digest of %j', (msg, digest) => {
    expect(hex(msg)).toBe(digest);
  });

  it('digests one million "a" as FIPS 180-2 appendix B.3 gives', () => {
    expect(hex('a'.repeat(1_000_000))).toBe('cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0');
  });

  it('agrees with Node crypto on any text, including non-ASCII and lone surrogates (oracle: node:crypto)', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 300 }), (s) => {
        const viaNode = createHash('sha256').update(Buffer.from(s, 'utf8')).digest('hex');
        expect(hex(s)).toBe(viaNode);
        expect(Buffer.from(utf8Bytes(s)).equals(Buffer.from(s, 'utf8'))).toBe(true);
      }),
      { numRuns: 300 },
    );
  });

  it('agrees with Node crypto across block boundaries (lengths 0–200 bytes)', () => {
    for (let n = 0; n <= 200; n++) {
      const bytes = Uint8Array.from({ length: n }, (_, i) => (i * 37 + n) & 255);
      expect(sha256Hex(bytes)).toBe(createHash('sha256').update(bytes).digest('hex'));
    }
  });
});

const SITE_ID = '3f1c2a9e-8b7d-4c6e-9f01-2a3b4c5d6e7f';
const READING_ID = '7d8e9f00-1a2b-4c3d-8e4f-5a6b7c8d9e0f';
const rev = (ms: number) => formatRev({ wall_ms: ms, counter: 0, deviceId: 'phone-a' });

function records(): SyncRecord[] {
  const t = Date.UTC(2026, 10, 20, 9, 30);
  return [
    {
      kind: 'site', id: SITE_ID, rev: rev(t),
      body: {
        code: 'TR-07', name: 'Tarn Rill at Slate Ford', area_km2: 6.3, timeZone: 'Europe/Oslo',
        displayUnits: 'metric', jumpLimit_m: 0.25, updated_ms: t,
      },
    },
    {
      kind: 'reading', id: READING_ID, rev: rev(t + 1000),
      body: {
        siteId: SITE_ID, time_ms: t, stage_m: 0.734, source: 'staff', quality: 'good', observer: 'Å. Lind',
        note: 'weed on the control – «light»', warnings: [], updated_ms: t + 1000,
      },
    },
  ];
}

const BUNDLE_ID = 'a1b2c3d4-e5f6-4789-8abc-def012345678';
const made = () => makeBundle({ id: BUNDLE_ID, device: 'phone-a', created_ms: Date.UTC(2026, 10, 20, 10), records: records() });

describe('makeBundle / parseBundle', () => {
  it('makes a bundle whose checksum is the SHA-256 of JSON.stringify(records) (oracle: node:crypto)', () => {
    const b = made();
    expect(b.format).toBe('freshet-bundle');
    expect(b.version).toBe(1);
    expect(b.created).toBe('2026-11-20T10:00:00.000Z');
    const expected = createHash('sha256').update(JSON.stringify(b.records), 'utf8').digest('hex');
    expect(b.checksum).toBe(`sha256:${expected}`);
    expect(bundleChecksum(b.records)).toBe(b.checksum);
  });

  it('reads back a bundle that went through JSON text', () => {
    const b = made();
    const back = parseBundle(JSON.parse(JSON.stringify(b)));
    expect(back).toEqual(b);
  });

  const refusals: [string, (b: Record<string, unknown>) => unknown, string][] = [
    ['not an object', () => [1, 2], 'shape'],
    ['another format', (b) => ({ ...b, format: 'other-tool' }), 'format'],
    ['a newer version', (b) => ({ ...b, version: 2 }), 'version'],
    ['a version that is not a whole number', (b) => ({ ...b, version: '1' }), 'version'],
    ['a bad id', (b) => ({ ...b, id: 'not-a-uuid' }), 'shape'],
    ['no device', (b) => ({ ...b, device: '' }), 'shape'],
    ['a creation time without offset', (b) => ({ ...b, created: '2026-11-20T10:00:00' }), 'shape'],
    ['records not a list', (b) => ({ ...b, records: {} }), 'shape'],
    ['a malformed checksum', (b) => ({ ...b, checksum: 'md5:00' }), 'checksum'],
    ['a changed stage', (b) => {
      const r = structuredClone(b.records) as { body: { stage_m?: number } }[];
      r[1].body.stage_m = 0.743;
      return { ...b, records: r };
    }, 'checksum'],
  ];
  it.each(refusals)('refuses %s with the reason named', (_label, damage, reason) => {
    const b = JSON.parse(JSON.stringify(made())) as Record<string, unknown>;
    let error: unknown;
    try {
      parseBundle(damage(b));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(BundleError);
    expect((error as BundleError).reason).toBe(reason);
    expect((error as BundleError).message.length).toBeGreaterThan(20);
  });

  it('refuses an invalid record by its position, even with a matching checksum', () => {
    const r = records();
    (r[1].body as { stage_m: number }).stage_m = Number.NaN;
    const b = JSON.parse(JSON.stringify({ ...made(), records: r, checksum: bundleChecksum(JSON.parse(JSON.stringify(r))) }));
    let error: BundleError | undefined;
    try {
      parseBundle(b);
    } catch (e) {
      error = e as BundleError;
    }
    expect(error?.reason).toBe('record');
    expect(error?.recordIndex).toBe(1);
    expect(error?.message).toMatch(/Record 2 of the bundle/);
  });

  it('refuses one revision twice with different content, accepts an exact repeat', () => {
    const r = records();
    const same = [...r, structuredClone(r[1])];
    expect(() => parseBundle(makeBundle({ id: BUNDLE_ID, device: 'p', created_ms: 0, records: same }))).not.toThrow();
    const other = structuredClone(r[1]);
    (other.body as { note: string }).note = 'different';
    const clash = [...r, other];
    expect(() => parseBundle(makeBundle({ id: BUNDLE_ID, device: 'p', created_ms: 0, records: clash }))).toThrow(/different content/);
  });

  it('refuses to make a bundle with a bad id or time', () => {
    expect(() => makeBundle({ id: 'x', device: 'p', created_ms: 0, records: [] })).toThrow(RangeError);
    expect(() => makeBundle({ id: BUNDLE_ID, device: 'p', created_ms: 1.5, records: [] })).toThrow(RangeError);
  });
});
