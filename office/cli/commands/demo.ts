// `freshet demo`: the invented demo site (site, rating, gaugings, readings) as a bundle on stdout.
import { randomUUID } from 'node:crypto';
import { demoScenario, formatRev, makeBundle, toSyncRecord, type SyncRecord } from '../../../core/index';
import { parseCommandArgs, expectPositionals } from '../../shared/args';
import { CliError, type Command } from '../../shared/io';

const HELP = `Usage: freshet demo [--end TIME]

Writes the invented demo site (Pellow Burn at Lantern Bridge, code PB-03: site, rating, gaugings and
three weeks of 15-minute readings) as a bundle (JSON) to standard output. Every name and value in it
is invented.

Options:
  --end TIME   when the readings end, as an ISO 8601 time with offset (default: now),
               e.g. 2026-12-01T09:00:00+13:00
  -h, --help   show this help

Example:
  npx freshet demo > demo.json && npx freshet check demo.json
`;

/** The demo bundle's records ending at end_ms (UTC ms), stamped with revisions at made_ms (UTC ms) by device "freshet-demo". */
export function demoRecords(end_ms: number, made_ms: number): SyncRecord[] {
  const s = demoScenario(end_ms);
  let counter = 0;
  const env = () => ({ rev: formatRev({ wall_ms: made_ms, counter: counter++, deviceId: 'freshet-demo' }), updated_ms: made_ms });
  return [
    toSyncRecord('site', { ...s.site, ...env() }),
    toSyncRecord('rating', { ...s.rating, ...env() }),
    ...s.gaugings.map((g) => toSyncRecord('gauging', { ...g, ...env() })),
    ...s.readings.map((r) => toSyncRecord('reading', { ...r, ...env() })),
    ...s.loggerDays.map((d) => toSyncRecord('logger-day', { ...d, ...env() })),
  ];
}

/** The `demo` subcommand. */
export const demoCommand: Command = {
  name: 'demo',
  summary: 'write the invented demo site as a bundle to standard output',
  help: HELP,
  async run(args, io) {
    const parsed = parseCommandArgs('demo', args, { end: { type: 'string' } });
    expectPositionals('demo', parsed, []);
    const made_ms = Date.now();
    let end_ms = made_ms;
    const end = parsed.values.end;
    if (typeof end === 'string') {
      end_ms = /(Z|[+-]\d{2}:\d{2})$/.test(end) ? Date.parse(end) : NaN;
      if (!Number.isFinite(end_ms)) throw new CliError(`freshet demo: --end needs an ISO 8601 time with offset, e.g. 2026-12-01T09:00:00+13:00; got ${JSON.stringify(end)}`, 2);
    }
    const bundle = makeBundle({ id: randomUUID(), device: 'freshet-demo', created_ms: made_ms, records: demoRecords(end_ms, made_ms) });
    io.stdout(JSON.stringify(bundle) + '\n');
    return 0;
  },
};
