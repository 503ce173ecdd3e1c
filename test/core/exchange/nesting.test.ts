// The nesting limit of a bundle (core/exchange/README.md, "Limits": 32 levels counting the bundle object),
// checked before the checksum so a hostile document cannot overflow the stack of JSON.stringify. Exact
// cases built here; the depth of a value is counted as in RFC 8259's grammar (each object or array one level).
import { describe, expect, it } from 'vitest';
import { BundleError, bundleChecksum, makeBundle, MAX_BUNDLE_DEPTH, nestedDeeperThan, parseBundle, type SyncRecord } from '../../../core/index';

/** A list nested `levels` deep: [] is 1, [[]] is 2. */
function nested(levels: number): unknown {
  let v: unknown = [];
  for (let i = 1; i < levels; i++) v = [v];
  return v;
}

const site: SyncRecord = {
  kind: 'site', id: '2d5e8f31-7a4c-4b9e-a1d2-3c4b5a6f7e80', rev: '1780300800000-000000-nest-phone',
  body: { code: 'NV-01', name: 'Nest Vale', timeZone: 'UTC', displayUnits: 'metric', jumpLimit_m: 0.3, updated_ms: 1780300800000 },
} as SyncRecord;

function bundleWithExtra(extra: unknown): unknown {
  const records = [site, { ...site, id: '9a8b7c6d-5e4f-4a3b-9c2d-1e0f2a3b4c5d', body: { ...site.body, extra } }] as SyncRecord[];
  const b = makeBundle({ id: '0f1e2d3c-4b5a-4968-8776-a5b4c3d2e1f0', device: 'nest-phone', created_ms: 1780300800000, records: [site] });
  // The checksum is written by hand: bundleChecksum itself would overflow on the deepest case.
  return { ...b, records, checksum: 'sha256:' + '0'.repeat(64) };
}

describe('nesting depth', () => {
  it('counts each object or list as one level, without recursion', () => {
    expect(nestedDeeperThan(nested(3), 3)).toBe(false);
    expect(nestedDeeperThan(nested(4), 3)).toBe(true);
    expect(nestedDeeperThan({ a: [{ b: 1 }] }, 3)).toBe(false);
    expect(nestedDeeperThan({ a: [{ b: {} }] }, 3)).toBe(true);
    expect(nestedDeeperThan('text', 0)).toBe(false);
    expect(nestedDeeperThan(nested(1_000_000), MAX_BUNDLE_DEPTH)).toBe(true);
  });

  it('refuses a record nested 10,000 levels as that record, before the checksum', () => {
    // JSON.stringify recurses: on a receiver's default stack 10,000 levels overflowed (issue 19's probe).
    const deep = nested(10_000);
    let err: unknown;
    try {
      parseBundle(bundleWithExtra(deep));
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(BundleError);
    expect((err as BundleError).reason).toBe('record');
    expect((err as BundleError).recordIndex).toBe(1);
    expect((err as BundleError).message).toMatch(/Record 2 of the bundle is nested too deeply: .* at most 32 levels/);
  });

  it('takes a record exactly at the limit (the bundle 1, records 2, record 3, body 4, the field the rest)', () => {
    const atLimit = nested(MAX_BUNDLE_DEPTH - 4);
    const b = bundleWithExtra(atLimit) as { records: SyncRecord[] };
    const ok = { ...b, checksum: bundleChecksum(b.records) };
    expect(() => parseBundle(ok)).not.toThrow();
    const over = bundleWithExtra(nested(MAX_BUNDLE_DEPTH - 3)) as { records: SyncRecord[] };
    expect(() => parseBundle({ ...over, checksum: bundleChecksum(over.records) })).toThrow(/nested too deeply/);
  });

  it('names the bundle, not a record, when the nesting is outside the records', () => {
    const b = { ...(bundleWithExtra('flat') as object), note: nested(100) };
    expect(() => parseBundle(b)).toThrow(expect.objectContaining({ reason: 'shape' }));
  });
});
