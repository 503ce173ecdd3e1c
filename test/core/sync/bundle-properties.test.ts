// Bundle checks as properties over random record sets (fast-check): a bundle survives JSON unchanged,
// its checksum is SHA-256 of the records' JSON (node:crypto as the oracle, FIPS 180-4), and any change
// to a record, a newer version or another format is refused with the reason that says which.
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { BundleError, formatRev, makeBundle, parseBundle, type SyncRecord } from '../../../core/index';

const uuid = fc.uuid({ version: 4 }).map((u) => u.toLowerCase());
const readingArb: fc.Arbitrary<SyncRecord> = fc
  .record({
    id: uuid, site: uuid, wall: fc.integer({ min: 1_700_000_000_000, max: 1_900_000_000_000 }), counter: fc.integer({ min: 0, max: 999_999 }),
    t: fc.integer({ min: 0, max: 4_102_444_800_000 }), stage: fc.double({ min: -5, max: 30, noNaN: true }), note: fc.string({ maxLength: 40 }),
    deleted: fc.boolean(),
  })
  .map(({ id, site, wall, counter, t, stage, note, deleted }) => {
    const r = {
      kind: 'reading', id, rev: formatRev({ wall_ms: wall, counter, deviceId: 'phone-7' }),
      // JSON has no negative zero: -0 is written as 0, so the generator gives 0 for it.
      body: { siteId: site, time_ms: t, stage_m: stage + 0, source: 'staff', quality: 'good', observer: '', note, warnings: [], updated_ms: wall },
    };
    return (deleted ? { ...r, deleted: true } : r) as SyncRecord;
  });
const bundleArb = fc.tuple(uuid, fc.array(readingArb, { maxLength: 12 })).map(([id, records]) => makeBundle({ id, device: 'phone-7', created_ms: 1_767_225_600_000, records }));

function reason(x: unknown): string | undefined {
  try {
    parseBundle(x);
    return undefined;
  } catch (e) {
    return e instanceof BundleError ? e.reason : 'other';
  }
}

describe('bundles over random record sets', () => {
  it('survive JSON unchanged and carry SHA-256 of the records’ JSON', () => {
    fc.assert(
      fc.property(bundleArb, (b) => {
        const again = parseBundle(JSON.parse(JSON.stringify(b)));
        expect(again).toEqual(b);
        expect(b.checksum).toBe(`sha256:${createHash('sha256').update(JSON.stringify(b.records), 'utf8').digest('hex')}`);
      }),
      { numRuns: 200 },
    );
  });

  it('refuse any changed stage or note with reason "checksum"', () => {
    fc.assert(
      fc.property(bundleArb.filter((b) => b.records.length > 0), fc.nat(), fc.string({ minLength: 1, maxLength: 5 }), (b, k, extra) => {
        const copy = JSON.parse(JSON.stringify(b)) as { records: { body: { note: string; stage_m: number } }[] };
        const r = copy.records[k % copy.records.length];
        if (k % 2 === 0) r.body.note += extra;
        else r.body.stage_m = r.body.stage_m + 0.001;
        expect(reason(copy)).toBe('checksum');
      }),
      { numRuns: 200 },
    );
  });

  it('refuse a newer version and another format, whatever the records', () => {
    fc.assert(
      fc.property(bundleArb, fc.integer({ min: 2, max: 1000 }), fc.string({ maxLength: 20 }), (b, v, f) => {
        expect(reason({ ...b, version: v })).toBe('version');
        if (f !== 'freshet-bundle') expect(reason({ ...b, format: f })).toBe('format');
      }),
      { numRuns: 200 },
    );
  });

  it('refuse a record that is not valid (checksum recomputed) with reason "record" and its position', () => {
    fc.assert(
      fc.property(bundleArb.filter((b) => b.records.length > 0), fc.nat(), (b, k) => {
        const records = JSON.parse(JSON.stringify(b.records)) as SyncRecord[];
        const i = k % records.length;
        (records[i] as { rev: string }).rev = 'yesterday';
        const bad = makeBundle({ id: b.id, device: b.device, created_ms: 1_767_225_600_000, records });
        try {
          parseBundle(bad);
          expect.unreachable('a record with a bad revision was accepted');
        } catch (e) {
          expect(e).toBeInstanceOf(BundleError);
          expect((e as BundleError).reason).toBe('record');
          expect((e as BundleError).recordIndex).toBe(i);
        }
      }),
      { numRuns: 100 },
    );
  });
});
