// `freshet photos` and the photos column of `freshet csv`, from the office's embedded database: the files
// written are the bytes the office holds (SHA-256 oracle: node:crypto), named safely, with photos.csv read
// back by papaparse (a test-only oracle); times in the site's zone per the IANA tz database (New Zealand
// keeps UTC+12 in June, UTC+13 in December).
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeBundle, nextRev, type PhotoBody, type SyncKind, type SyncRecord } from '../../core/index';
import { run } from '../../office/cli/index';
import { insertBlob } from '../../office/receiver/blob-store';
import { importBundle } from '../../office/receiver/import-files';
import { openOfficeDatabase } from '../../office/receiver/open';
import { gauging, reading, site } from '../support/records';

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');
const dir = mkdtempSync(join(tmpdir(), 'freshet-photos-cmd-'));
const data = join(dir, 'office');
const SITE = randomUUID();
const OTHER_SITE = randomUUID();
const READING = randomUUID();
const GAUGING = randomUUID();
/** 2026-06-01T00:00:00Z: noon NZST (UTC+12, IANA tz database). */
const JUNE_1 = Date.UTC(2026, 5, 1);
/** 2026-12-01T00:00:00Z: 13:00 NZDT (UTC+13, IANA tz database). */
const DEC_1 = Date.UTC(2026, 11, 1);

let counter = 0;
function rec<K extends SyncKind>(kind: K, id: string, body: Omit<SyncRecord<K>['body'], 'updated_ms'>, deleted = false): SyncRecord<K> {
  const at = JUNE_1 + ++counter;
  return { kind, id, rev: nextRev(undefined, at, 'office-test'), ...(deleted ? { deleted: true } : {}), body: { ...body, updated_ms: at } } as SyncRecord<K>;
}

function photoBody(owner: PhotoBody['owner'], bytes: Uint8Array, taken_ms: number, extra: Partial<PhotoBody> = {}): PhotoBody {
  return { siteId: SITE, owner, sha256: sha(bytes), bytes: bytes.length, type: 'image/jpeg', width_px: 800, height_px: 600, taken_ms, ...extra };
}

const jpeg = new Uint8Array(randomBytes(4000));
const png = new Uint8Array(randomBytes(3000));
const original = new Uint8Array(randomBytes(9000));
const absent = new Uint8Array(randomBytes(100));
const ids = { reading: randomUUID(), gauging: randomUUID(), site: randomUUID(), deleted: randomUUID(), other: randomUUID() };

async function freshet(args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await run(args, { stdout: (t) => void (out += t), stderr: (t) => void (err += t), cwd: dir });
  return { code, out, err };
}

beforeAll(async () => {
  const db = await openOfficeDatabase({ data });
  try {
    const records: SyncRecord[] = [
      rec('site', SITE, site({ code: 'KC-01' })),
      rec('site', OTHER_SITE, site({ code: 'KC-02', name: 'Kettle Creek at the ford' })),
      rec('reading', READING, reading(SITE, JUNE_1, 0.62)),
      rec('gauging', GAUGING, gauging(SITE, DEC_1)),
      rec('photo', ids.reading, photoBody({ kind: 'reading', id: READING }, jpeg, JUNE_1, { caption: 'Staff gauge, weed on the control' })),
      rec('photo', ids.gauging, photoBody({ kind: 'gauging', id: GAUGING }, png, DEC_1, {
        type: 'image/png', caption: '=HYPERLINK("x") section, left bank', original: { sha256: sha(original), bytes: original.length, type: 'image/jpeg' },
      })),
      rec('photo', ids.site, photoBody({ kind: 'site', id: SITE }, absent, JUNE_1 + 3_600_000)),
      rec('photo', ids.deleted, photoBody({ kind: 'reading', id: READING }, jpeg, JUNE_1 + 60_000), true),
      rec('photo', ids.other, { ...photoBody({ kind: 'site', id: OTHER_SITE }, jpeg, JUNE_1), siteId: OTHER_SITE }),
    ];
    const out = await importBundle(db, makeBundle({ id: randomUUID(), device: 'office-test', created_ms: DEC_1, records }));
    expect(out.status).toBe('stored');
    for (const [b, type] of [[jpeg, 'image/jpeg'], [png, 'image/png'], [original, 'image/jpeg']] as const) await insertBlob(db, sha(b), type, b);
  } finally {
    await db.close();
  }
}, 120_000);

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('freshet photos', () => {
  it('writes the site\'s held photos and photos.csv; a photo not yet arrived is listed without a file', async () => {
    const r = await freshet(['photos', '--data', data, '--site', 'KC-01', '--out', 'photos']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^Wrote 2 photos of KC-01 and photos\.csv to /);
    expect(r.err).toMatch(/1 photo has not reached the office yet/);
    const out = join(dir, 'photos');
    const files = readdirSync(out).sort();
    expect(files).toEqual([
      `20260601-120000_reading_${ids.reading}.jpg`,
      `20261201-130000_gauging_${ids.gauging}.png`,
      `20261201-130000_gauging_${ids.gauging}_original.jpg`,
      'photos.csv',
    ].sort());
    for (const f of files) expect(f).toMatch(/^[A-Za-z0-9._-]+$/);
    expect(sha(readFileSync(join(out, `20260601-120000_reading_${ids.reading}.jpg`)))).toBe(sha(jpeg));
    expect(sha(readFileSync(join(out, `20261201-130000_gauging_${ids.gauging}.png`)))).toBe(sha(png));
    expect(sha(readFileSync(join(out, `20261201-130000_gauging_${ids.gauging}_original.jpg`)))).toBe(sha(original));

    const text = readFileSync(join(out, 'photos.csv'), 'utf8');
    const rows = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true });
    expect(rows.errors).toEqual([]);
    expect(rows.data.map((p) => p.photo_id)).toEqual([ids.reading, ids.site, ids.gauging]);
    const [r1, r2, r3] = rows.data;
    expect(r1).toMatchObject({
      site: 'KC-01', owner_kind: 'reading', owner_id: READING, taken: '2026-06-01T12:00:00+12:00', taken_utc: '2026-06-01T00:00:00Z',
      caption: 'Staff gauge, weed on the control', file: `20260601-120000_reading_${ids.reading}.jpg`, sha256: sha(jpeg), bytes: '4000',
      type: 'image/jpeg', note: '',
    });
    expect(r2).toMatchObject({ owner_kind: 'site', owner_id: SITE, file: '', sha256: sha(absent), taken: '2026-06-01T13:00:00+12:00' });
    expect(r2.note).toMatch(/has not reached the office yet/);
    expect(r3).toMatchObject({ owner_kind: 'gauging', taken: '2026-12-01T13:00:00+13:00', original_file: `20261201-130000_gauging_${ids.gauging}_original.jpg` });
    // A caption a spreadsheet could take for a formula is written as text (OWASP "CSV Injection").
    expect(r3.caption).toBe('\'=HYPERLINK("x") section, left bank');
  });

  it('makes the folder and files with the umask\'s permissions, as the other exports do', async () => {
    // Reading the umask (no argument) is allowed in a worker thread; setting it is not.
    const mask = process.umask();
    const out = join(dir, 'photos');
    expect(statSync(out).mode & 0o777).toBe(0o777 & ~mask);
    expect(statSync(join(out, 'photos.csv')).mode & 0o777).toBe(0o666 & ~mask);
    expect(statSync(join(out, `20260601-120000_reading_${ids.reading}.jpg`)).mode & 0o777).toBe(0o666 & ~mask);
  });

  it('finds the site by its id too, and says plainly what is missing or wrong', async () => {
    const byId = await freshet(['photos', '--data', data, '--site', OTHER_SITE, '--out', 'other']);
    expect(byId.code).toBe(0);
    expect(readdirSync(join(dir, 'other')).sort()).toEqual([`20260601-120000_site_${ids.other}.jpg`, 'photos.csv']);
    const none = await freshet(['photos', '--data', data, '--site', 'XX-99', '--out', 'never']);
    expect(none.code).toBe(1);
    expect(none.err).toBe('freshet photos: the office database has no site with code or id "XX-99"\n');
    expect((await freshet(['photos', '--data', data, '--site', 'KC-01'])).err).toMatch(/--out <dir> is required/);
    expect((await freshet(['photos', '--site', 'KC-01', '--out', 'never'])).err).toMatch(/--data <folder> or --database <url>/);
    const busy = await freshet(['photos', '--data', data, '--site', 'KC-01', '--out', 'photos']);
    expect(busy.code).toBe(1);
    expect(busy.err).toMatch(/already holds files/);
    expect(readdirSync(dir)).not.toContain('never');
  });
});

describe('freshet csv names each record\'s photos', () => {
  it('ends the readings and gaugings tables with the photo files of each record', async () => {
    const r = await freshet(['csv', '--data', data, '--site', 'KC-01', '--out', 'tables']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const read = (name: string) => Papa.parse<Record<string, string>>(readFileSync(join(dir, 'tables', name), 'utf8').replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true });
    const readings = read('KC-01_readings.csv');
    expect(readings.errors).toEqual([]);
    expect(readings.data.find((x) => x.id === READING)?.photos).toBe(`20260601-120000_reading_${ids.reading}.jpg`);
    const gaugings = read('KC-01_gaugings.csv');
    expect(gaugings.data.find((x) => x.id === GAUGING)?.photos).toBe(`20261201-130000_gauging_${ids.gauging}.png`);
  });
});
