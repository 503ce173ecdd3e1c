// `freshet csv <bundle.json> --out <dir>`: the CSV tables of every site in a bundle, written all at once.
import { gaugingsToCsv, gaugingVerticalsToCsv, photoFilesByOwner, ratingSegmentsToCsv, ratingTablesToCsv, readingsToCsv } from '../../../core/index';
import { parseCommandArgs } from '../../shared/args';
import { CliError, type Command } from '../../shared/io';
import { DATABASE_SOURCE_HELP, DATABASE_SOURCE_OPTIONS, exportRecords } from '../../receiver/export-source';
import { siteStems, sitesOf } from '../site-data';
import { stormFiles } from '../storm-files';
import { writeFilesAtomically, type OutputFile } from '../write-files';

const HELP = `Usage: freshet csv <bundle.json> --out <dir>
       freshet csv (--data <dir> | --database <url>) --site <code> --out <dir>

Writes CSV tables (RFC 4180, UTF-8 with a byte-order mark, ISO 8601 times with the site's UTC offset,
units in the header, in each site's display units) for every site in the bundle:
  <site>_readings.csv         the stage record: every spot reading and logger value with source, stage,
                              raw logger value and correction, shift, discharge, extrapolated flag, quality
  <site>_gaugings.csv         gaugings: mean stage, discharge, method, grade
                              (for a site with photos both tables end with a photos column: the files
                              freshet photos writes for each record's photos, separated by spaces)
  <site>_gauging_verticals.csv  the verticals of gaugings entered vertical by vertical, one row each (the
                              gauging's id, station, depth, velocities, angle, and the width, area,
                              discharge and share of its subsection by the mid-section method); the same
                              table the phone's Data screen writes (only the header when there are none)
  <site>_rating_segments.csv  each rating's power-law segments, coefficients in SI (Q m³/s, h m)
  <site>_rating_tables.csv    each rating as a stage–discharge table (no shift), extrapolated rows marked
  <site>_storm_<date>.csv     each saved storm analysis: discharge, baseflow and direct runoff per time
                              (separated again from the site's stage record with the analysis's method;
                              one that cannot be is named as not written, and the exit status is 1)
Text that a spreadsheet could take for a formula is written with a leading apostrophe.
The folder must be new or empty; nothing is written unless every file is.

Options:
  --out DIR    the folder to write (required)
${DATABASE_SOURCE_HELP}
  -h, --help   show this help
`;

/** The `csv` subcommand. */
export const csvCommand: Command = {
  name: 'csv',
  summary: 'write the CSV tables of every site in a bundle into a folder',
  help: HELP,
  async run(args, io) {
    const parsed = parseCommandArgs('csv', args, { out: { type: 'string' }, ...DATABASE_SOURCE_OPTIONS });
    const out = parsed.values.out;
    if (typeof out !== 'string' || out === '') throw new CliError('freshet csv: --out <dir> is required (try freshet csv --help)', 2);
    const sites = sitesOf(await exportRecords('csv', parsed, io));
    if (sites.length === 0) throw new CliError(`freshet csv: ${parsed.positionals[0]} holds no site, so there is nothing to export`);
    const stems = siteStems(sites.map((s) => s.site));
    const files: OutputFile[] = [];
    const skipped: string[] = [];
    sites.forEach((s, i) => {
      const o = { siteCode: s.site.code, timeZone: s.site.timeZone, units: s.site.displayUnits };
      const stem = stems[i];
      // A site with photos gets a photos column in its readings and gaugings tables (else the same tables as the phone's).
      const photos = s.photos.length > 0 ? { ...o, photos: photoFilesByOwner(s) } : o;
      files.push({ name: `${stem}_readings.csv`, text: readingsToCsv(s.readings, photos) });
      files.push({ name: `${stem}_gaugings.csv`, text: gaugingsToCsv(s.gaugings, photos) });
      files.push({ name: `${stem}_gauging_verticals.csv`, text: gaugingVerticalsToCsv(s.gaugings, o) });
      files.push({ name: `${stem}_rating_segments.csv`, text: ratingSegmentsToCsv(s.ratings, o) });
      files.push({ name: `${stem}_rating_tables.csv`, text: ratingTablesToCsv(s.ratings, o) });
      const storms = stormFiles(s, stem);
      files.push(...storms.files);
      skipped.push(...storms.skipped);
    });
    const dir = await writeFilesAtomically('csv', out, files, io.cwd);
    io.stdout(`Wrote ${files.length} CSV files for ${sites.length} site${sites.length === 1 ? '' : 's'} to ${dir}\n`);
    for (const why of skipped) io.stderr(`freshet csv: not written: ${why}\n`);
    if (skipped.length > 0) {
      io.stderr(`freshet csv: ${skipped.length} file${skipped.length === 1 ? ' was' : 's were'} not written (see above); the exit status is 1\n`);
      return 1;
    }
    return 0;
  },
};
