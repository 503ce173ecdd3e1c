// `freshet check <bundle.json>`: validates a bundle (format, version, checksum, every record) and prints
// a summary; a bad bundle ends with one plain line and exit status 1.
import { SYNC_KINDS } from '../../../core/index';
import { expectPositionals, parseCommandArgs } from '../../shared/args';
import type { Command } from '../../shared/io';
import { readBundleFileParts } from '../../shared/read-bundle';
import { sitesOf } from '../site-data';

const HELP = `Usage: freshet check <bundle.json>

Checks a Freshet bundle: that it is JSON in the bundle format, a version this command reads, that its
records match its SHA-256 checksum, and that every record is valid. Prints a summary: the bundle's id,
device and time, the records of each kind, the sites with their readings, and the photos whose bytes
the file carries (each checked against its SHA-256).
Exit status: 0 a good bundle; 1 a bad or unreadable bundle (one line says why); 2 bad arguments.

Options:
  -h, --help   show this help
`;

const count = (n: number, noun: string) => `${n} ${noun}${n === 1 ? '' : 's'}`;

/** The `check` subcommand. */
export const checkCommand: Command = {
  name: 'check',
  summary: 'check a bundle (format, version, checksum, records) and summarise it',
  help: HELP,
  async run(args, io) {
    const [path] = expectPositionals('check', parseCommandArgs('check', args, {}), ['bundle.json']);
    const { bundle, blobs } = await readBundleFileParts('check', path, io.cwd);
    const counts = SYNC_KINDS.map((k) => {
      const of = bundle.records.filter((r) => r.kind === k);
      const deleted = of.filter((r) => r.deleted === true).length;
      return `${k} ${of.length}${deleted > 0 ? ` (${deleted} deleted)` : ''}`;
    });
    const lines = [
      `${path}: a good bundle (format ${bundle.format}, version ${bundle.version}, checksum matches)`,
      `  id ${bundle.id}, from device ${bundle.device}, made ${bundle.created}`,
      `  ${bundle.records.length} records: ${counts.join(', ')}`,
    ];
    for (const s of sitesOf(bundle.records)) {
      const r = s.readings;
      const span = r.length > 0 ? `, ${new Date(r[0].reading.time_ms).toISOString()} to ${new Date(r[r.length - 1].reading.time_ms).toISOString()}` : '';
      lines.push(`  site ${s.site.code} (${s.site.name}): ${count(r.length, 'reading')}${span}; ${count(s.gaugings.length, 'gauging')}; ${count(s.ratings.length, 'rating')}`);
    }
    const photos = bundle.records.filter((r) => r.kind === 'photo' && r.deleted !== true);
    if (blobs.size > 0 || photos.length > 0) {
      const without = photos.filter((r) => !blobs.has((r.body as { sha256: string }).sha256)).length;
      lines.push(`  ${count(blobs.size, 'photo')} carried, each matching its SHA-256${without > 0 ? `; ${count(without, 'photo record')} without ${without === 1 ? 'its' : 'their'} bytes in this file` : ''}`);
    }
    io.stdout(lines.join('\n') + '\n');
    return 0;
  },
};
