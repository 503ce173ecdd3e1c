// `freshet photos (--data <dir> | --database <url>) --site <code or id> --out <dir>`: a site's photos as
// files, with photos.csv listing each one (what it belongs to, when, caption, file, hash, size). Photos
// whose bytes have not reached the office yet are listed without a file, with a note.
import { csvNumber, csvTable, isoWithOffsetFormatter, photoNamer, type CsvColumn, type PhotoRecord } from '../../../core/index';
import { expectPositionals, parseCommandArgs } from '../../shared/args';
import { CliError, type Command } from '../../shared/io';
import { heldBlobs, readBlob } from '../../receiver/blob-store';
import { openSourceDatabase, sitePhotosFromDatabase } from '../../receiver/photo-source';
import { writeFilesAtomically, type BytesOutputFile, type OutputFile } from '../write-files';

const HELP = `Usage: freshet photos (--data <dir> | --database <url>) --site <code or id> --out <dir>

Writes the photos of one site held by the office (the latest version of each, deleted ones left out)
into a new folder, named by the time taken (the site's clock), the kind of record each belongs to and
the photo's id, e.g. 20260601-093000_reading_<id>.jpg (a kept original adds _original), and
  photos.csv   one row per photo: what it belongs to (kind and id), the photo's id, the time taken in
               the site's zone and in UTC, caption, file, SHA-256, size in bytes, type, pixel size,
               the original's file; a photo whose bytes have not reached the office yet has no file
               and a note saying so
The folder must be new or empty; nothing is written unless every file is.

Options:
  --data DIR       the office receiver's embedded database in DIR
  --database URL   the office receiver's PostgreSQL database
  --site CODE      the site (its office code, or its id)
  --out DIR        the folder to write (required)
  -h, --help       show this help
`;

const COLUMNS: CsvColumn[] = [
  { name: 'site', kind: 'text' }, { name: 'owner_kind', kind: 'text' }, { name: 'owner_id', kind: 'text' },
  { name: 'photo_id', kind: 'text' }, { name: 'taken', kind: 'time' }, { name: 'taken_utc', kind: 'time' },
  { name: 'caption', kind: 'text' }, { name: 'file', kind: 'text' }, { name: 'sha256', kind: 'text' },
  { name: 'bytes', kind: 'number' }, { name: 'type', kind: 'text' }, { name: 'width_px', kind: 'number' },
  { name: 'height_px', kind: 'number' }, { name: 'original_file', kind: 'text' }, { name: 'note', kind: 'text' },
];

const NOT_ARRIVED = 'the photo has not reached the office yet (the phone that took it sends it when it next syncs)';

/** The `photos` subcommand. */
export const photosCommand: Command = {
  name: 'photos',
  summary: 'write one site\'s photos held by the office, with a CSV index, into a folder',
  help: HELP,
  async run(args, io) {
    const parsed = parseCommandArgs('photos', args, { data: { type: 'string' }, database: { type: 'string' }, site: { type: 'string' }, out: { type: 'string' } });
    expectPositionals('photos', parsed, []);
    const { out, site } = parsed.values;
    if (typeof site !== 'string' || site === '') throw new CliError('freshet photos: --site <code or id> is required (try freshet photos --help)', 2);
    if (typeof out !== 'string' || out === '') throw new CliError('freshet photos: --out <dir> is required (try freshet photos --help)', 2);
    const db = await openSourceDatabase('photos', parsed);
    try {
      const { site: s, photos } = await sitePhotosFromDatabase('photos', db, site);
      const held = await heldBlobs(db, photos.flatMap((p) => [p.sha256, ...(p.original ? [p.original.sha256] : [])]));
      const name = photoNamer(s.timeZone);
      const iso = isoWithOffsetFormatter(s.timeZone);
      const files: (OutputFile | BytesOutputFile)[] = [];
      const bytesOf = (sha256: string) => async () => {
        const blob = await readBlob(db, sha256);
        if (blob === undefined) throw new Error(`photo ${sha256} is no longer held`);
        return blob.data;
      };
      let missing = 0;
      const rows = photos.map((p: PhotoRecord) => {
        const file = held.has(p.sha256) ? name(p) : '';
        if (file !== '') files.push({ name: file, bytes: bytesOf(p.sha256) });
        else missing++;
        const original = p.original !== undefined && held.has(p.original.sha256) ? name(p, p.original) : '';
        if (original !== '' && p.original) files.push({ name: original, bytes: bytesOf(p.original.sha256) });
        const notes = [file === '' ? NOT_ARRIVED : '', p.original && original === '' ? 'the kept original has not reached the office yet' : ''].filter((n) => n !== '');
        return [
          s.code, p.owner.kind, p.owner.id, p.id, iso(p.taken_ms), new Date(p.taken_ms).toISOString().replace(/\.\d{3}Z$/, 'Z'), p.caption ?? '',
          file, p.sha256, csvNumber(p.bytes), p.type, csvNumber(p.width_px), csvNumber(p.height_px), original, notes.join('; '),
        ];
      });
      files.push({ name: 'photos.csv', text: csvTable(COLUMNS, rows) });
      const dir = await writeFilesAtomically('photos', out, files, io.cwd);
      const written = photos.length - missing;
      io.stdout(`Wrote ${written} photo${written === 1 ? '' : 's'} of ${s.code} and photos.csv to ${dir}\n`);
      if (missing > 0) io.stderr(`freshet photos: ${missing} photo${missing === 1 ? ' has' : 's have'} not reached the office yet; photos.csv lists ${missing === 1 ? 'it' : 'them'} without a file\n`);
      return 0;
    } finally {
      await db.close();
    }
  },
};
