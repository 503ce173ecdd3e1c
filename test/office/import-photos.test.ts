// A bundle file with photos imported at the office (`freshet office import`, no network): the photo bytes
// checked by their hashes and stored with the records in one go; a damaged photo refuses the file and
// nothing is stored; a bundle the office already had still gets its photos. SHA-256 oracle: node:crypto.
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { encodeBundleBlobs, nextRev, type Bundle, type PhotoBody, type SyncRecord } from '../../core/index';
import { run } from '../../office/cli/index';
import { runOffice } from '../../office/receiver/cli';
import { openOfficeDatabase } from '../../office/receiver/open';
import { bundleOf, readingRecords, SITE_ID, siteRecord, T0_MS } from '../support/office/phones';

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');
const dir = mkdtempSync(join(tmpdir(), 'freshet-import-photos-'));
const data = join(dir, 'office');

afterAll(() => rmSync(dir, { recursive: true, force: true }));

function photoOf(readingId: string, bytes: Uint8Array, type: PhotoBody['type'] = 'image/jpeg'): SyncRecord<'photo'> {
  return {
    kind: 'photo', id: randomUUID(), rev: nextRev(undefined, T0_MS + 1000, 'field-phone'),
    body: {
      siteId: SITE_ID, owner: { kind: 'reading', id: readingId }, sha256: sha(bytes), bytes: bytes.length, type,
      width_px: 1600, height_px: 1200, taken_ms: T0_MS + 1000, updated_ms: T0_MS + 1000,
    },
  };
}

/** Writes a bundle file carrying `photos` (bytes by hash) and returns its path. */
function bundleFile(name: string, bundle: Bundle, photos: Uint8Array[], type = 'image/jpeg'): string {
  const blobs = encodeBundleBlobs(new Map(photos.map((b) => [sha(b), { type, bytes: b }])));
  const path = join(dir, name);
  writeFileSync(path, JSON.stringify(photos.length > 0 ? { ...bundle, blobs } : bundle));
  return path;
}

async function office(args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await runOffice([...args, '--data', data], { stdout: (t) => void (out += t), stderr: (t) => void (err += t) });
  return { code, out, err };
}

async function held(): Promise<{ blobs: Map<string, Buffer>; records: number }> {
  const db = await openOfficeDatabase({ data });
  try {
    const rows = await db.query<{ sha256: string; data: Uint8Array }>('select sha256, data from office_blobs');
    const [n] = await db.query<{ n: string }>('select count(*)::text as n from current_records');
    return { blobs: new Map(rows.map((r) => [r.sha256, Buffer.from(r.data)])), records: Number(n.n) };
  } finally {
    await db.close();
  }
}

describe('freshet office import with photos', () => {
  it('refuses a file whose photo is damaged and stores nothing of it, nor of the other files named with it', async () => {
    const [reading] = readingRecords('field-phone', 1);
    const bytes = new Uint8Array(randomBytes(30_000));
    const good = bundleFile('good.json', bundleOf('field-phone', [siteRecord('field-phone'), reading, photoOf(reading.id, bytes)]), [bytes]);
    const [other] = readingRecords('field-phone', 1, 5);
    const otherBytes = new Uint8Array(randomBytes(2000));
    const damagedPath = bundleFile('damaged.json', bundleOf('field-phone', [other, photoOf(other.id, otherBytes)]), [otherBytes]);
    const file = JSON.parse(readFileSync(damagedPath, 'utf8'));
    const key = `sha256-${sha(otherBytes)}`;
    const flipped = Buffer.from(file.blobs[key].base64, 'base64');
    flipped[999] ^= 0x80;
    file.blobs[key].base64 = flipped.toString('base64');
    writeFileSync(damagedPath, JSON.stringify(file));
    const r = await office(['import', good, damagedPath]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/damaged\.json: The bytes of photo [0-9a-f]{12}… do not match its name: the file is damaged/);
    const after = await held();
    expect(after.blobs.size).toBe(0);
    expect(after.records).toBe(0);
  }, 120_000);

  it('stores the records and the photo bytes of a good file, and a photo that follows a bundle already held', async () => {
    const [reading] = readingRecords('field-phone', 1, 10);
    const jpeg = new Uint8Array(randomBytes(50_000));
    const photo = photoOf(reading.id, jpeg);
    const bundle = bundleOf('field-phone', [siteRecord('field-phone'), reading, photo]);
    const file = bundleFile('with-photo.json', bundle, [jpeg]);
    let checked = '';
    expect(await run(['check', file], { stdout: (t) => void (checked += t), stderr: () => {}, cwd: dir })).toBe(0);
    expect(checked).toMatch(/^ {2}1 photo carried, each matching its SHA-256$/m);
    const first = await office(['import', file]);
    expect(first.err).toBe('');
    expect(first.out).toMatch(/with-photo\.json: stored \(3 records, 1 photo\)/);
    expect(first.code).toBe(0);
    const after = await held();
    expect(after.records).toBe(3);
    expect(after.blobs.get(sha(jpeg))?.equals(Buffer.from(jpeg))).toBe(true);

    // The same bundle reached the office first without its photo (say, pushed before the photo could be
    // sent); the file brings the photo later.
    const [late] = readingRecords('field-phone', 1, 20);
    const png = new Uint8Array(randomBytes(7_000));
    const lateBundle = bundleOf('field-phone', [late, photoOf(late.id, png, 'image/png')]);
    const recordsOnly = bundleFile('records-only.json', lateBundle, []);
    let checkedLate = '';
    expect(await run(['check', recordsOnly], { stdout: (t) => void (checkedLate += t), stderr: () => {}, cwd: dir })).toBe(0);
    expect(checkedLate).toMatch(/^ {2}0 photos carried, each matching its SHA-256; 1 photo record without its bytes in this file$/m);
    expect((await office(['import', recordsOnly])).code).toBe(0);
    const again = await office(['import', bundleFile('records-and-photo.json', lateBundle, [png], 'image/png')]);
    expect(again.out).toMatch(/records-and-photo\.json: already had it \(2 records, 1 photo\)/);
    const last = await held();
    expect(last.blobs.get(sha(png))?.equals(Buffer.from(png))).toBe(true);
    expect(last.records).toBe(5);
  }, 120_000);
});
