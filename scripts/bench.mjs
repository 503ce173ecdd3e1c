// `npm run bench`: every benchmark figure as a JSON line on stdout (value, floor measured in the same run,
// ratio, target). First the first-visit size of a fresh production build, then the Node benchmarks (core,
// the office receiver), then the Chromium ones (storage). The office figures run on PGlite and on a
// PostgreSQL server whenever one can be had: the one named by FRESHET_TEST_POSTGRES_URL, or else a
// throwaway cluster started here when PostgreSQL is installed (scripts/bench-postgres.mjs). The last line
// names every figure that was skipped and why.
import { spawnSync } from 'node:child_process';
import { cpus, loadavg } from 'node:os';
import { existsSync, readdirSync } from 'node:fs';
import { ensureInstall } from './ensure-install.mjs';
import { ensureChromium } from './find-chromium.mjs';
import { startBenchPostgres } from './bench-postgres.mjs';

const skipped = [];
process.once('SIGINT', () => process.exit(130));

function line(figure) {
  process.stdout.write(JSON.stringify(figure) + '\n');
}

// Runs one step; a benchmark's stdout is passed on and its skipped lines are collected for the summary.
function run(args, env) {
  const r = spawnSync(process.execPath, args, { stdio: ['ignore', 'pipe', 'inherit'], env, maxBuffer: 64 * 1024 * 1024 });
  const out = r.stdout?.toString() ?? '';
  process.stdout.write(out);
  for (const l of out.split('\n')) {
    if (!l.startsWith('{')) continue;
    try {
      const f = JSON.parse(l);
      if (typeof f.skipped === 'string') skipped.push({ name: f.name, reason: f.skipped });
    } catch {
      // Not a figure line.
    }
  }
  return r.status ?? 1;
}

function machine(when) {
  line({ name: `bench-machine-${when}`, cpus: cpus().length, load_1min: Number(loadavg()[0].toFixed(2)), note: 'figures are noisy when the load is above the cpu count' });
}

ensureInstall();
machine('start');
const pg = startBenchPostgres();
if (pg.skipped) line({ name: 'postgresql-server', skipped: pg.skipped });
else line({ name: 'postgresql-server', note: pg.note });
const env = pg.url ? { ...process.env, FRESHET_TEST_POSTGRES_URL: pg.url } : { ...process.env };
let status = 0;
try {
  const steps = [
    ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'error'],
    'chromium',
    ['--import', 'tsx', 'test/bench/first-visit.bench.ts'],
    ['--expose-gc', '--import', 'tsx', 'test/bench/run-node.ts'],
    ...readdirSync('test/bench').filter((f) => f.endsWith('.browser.ts')).sort().map((f) => ['--import', 'tsx', `test/bench/${f}`]),
  ];
  for (const step of steps) {
    if (step === 'chromium') {
      ensureChromium();
      continue;
    }
    if (step[2]?.startsWith('test/bench/') && !existsSync(step[2])) continue;
    status = run(step, env);
    if (status !== 0) break;
  }
} finally {
  pg.stop();
}
machine('end');
line({ name: 'bench-skipped', skipped, note: skipped.length === 0 ? 'every figure was measured' : `${skipped.length} figure group(s) not measured in this run` });
process.exit(status);
