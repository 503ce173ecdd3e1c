// `freshet waterml <bundle.json> --out <dir>`: WaterML 2.0 documents of every site in a bundle, written
// all at once: Part 1 for its readings and discharges, Part 2 for its ratings and gaugings.
import { watermlRatings, watermlTimeseries } from '../../../core/index';
import { parseCommandArgs } from '../../shared/args';
import { CliError, type Command } from '../../shared/io';
import { DATABASE_SOURCE_HELP, DATABASE_SOURCE_OPTIONS, exportRecords } from '../../receiver/export-source';
import { siteStems, sitesOf } from '../site-data';
import { writeFilesAtomically, type OutputFile } from '../write-files';

const HELP = `Usage: freshet waterml <bundle.json> --out <dir>
       freshet waterml (--data <dir> | --database <url>) --site <code> --out <dir>

Writes OGC WaterML 2.0 documents for every site in the bundle:
  <site>_timeseries.xml   Part 1: stage (m) and discharge (m3/s) time series per reading source (logger
                          values drift-corrected, in their own series), times
                          with the site's UTC offset, per-point quality, extrapolated discharges marked
  <site>_ratings.xml      Part 2: each rating as a conversion table fine enough for linear interpolation
                          (power-law coefficients stated), dated shifts, periods of validity, and the
                          gaugings as observations
A site without readings gets no Part 1 document; one without ratings or gaugings gets no Part 2.
Discharges are estimates from the rating in force at each time.
The folder must be new or empty; nothing is written unless every file is.

Options:
  --out DIR    the folder to write (required)
${DATABASE_SOURCE_HELP}
  -h, --help   show this help
`;

/** The `waterml` subcommand. */
export const watermlCommand: Command = {
  name: 'waterml',
  summary: 'write WaterML 2.0 (Part 1 time series, Part 2 ratings and gaugings) of every site in a bundle or the office database',
  help: HELP,
  async run(args, io) {
    const parsed = parseCommandArgs('waterml', args, { out: { type: 'string' }, ...DATABASE_SOURCE_OPTIONS });
    const out = parsed.values.out;
    if (typeof out !== 'string' || out === '') throw new CliError('freshet waterml: --out <dir> is required (try freshet waterml --help)', 2);
    const sites = sitesOf(await exportRecords('waterml', parsed, io));
    const source = typeof parsed.values.site === 'string' ? `site ${parsed.values.site}` : String(parsed.positionals[0]);
    const generated_ms = Date.now();
    const stems = siteStems(sites.map((s) => s.site));
    const files: OutputFile[] = [];
    sites.forEach((s, i) => {
      if (s.readings.length > 0) files.push({ name: `${stems[i]}_timeseries.xml`, text: watermlTimeseries({ site: s.site, readings: s.readings, generated_ms }) });
      if (s.ratings.length + s.gaugings.length > 0) {
        files.push({ name: `${stems[i]}_ratings.xml`, text: watermlRatings({ site: s.site, ratings: s.ratings, gaugings: s.gaugings, generated_ms }) });
      }
    });
    if (files.length === 0) throw new CliError(`freshet waterml: ${source} holds no site with readings, ratings or gaugings, so there is nothing to export`);
    const dir = await writeFilesAtomically('waterml', out, files, io.cwd);
    io.stdout(`Wrote ${files.length} WaterML 2.0 document${files.length === 1 ? '' : 's'} for ${sites.length} site${sites.length === 1 ? '' : 's'} to ${dir}\n`);
    return 0;
  },
};
