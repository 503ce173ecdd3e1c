// `npm run bench`: every benchmark figure as a JSON line on stdout. First the first-visit size of a
// fresh production build, then the Node benchmarks (core), then the Chromium ones (storage).
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import { ensureInstall } from './ensure-install.mjs';
import { ensureChromium } from './find-chromium.mjs';

function run(args) {
  const r = spawnSync(process.execPath, args, { stdio: ['ignore', 'inherit', 'inherit'], env: process.env });
  if (r.status !== 0) process.exit(r.status ?? 1);
}
ensureInstall();
run(['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'error']);
ensureChromium();
run(['--import', 'tsx', 'test/bench/first-visit.bench.ts']);
run(['--expose-gc', '--import', 'tsx', 'test/bench/run-node.ts']);
for (const f of readdirSync('test/bench').filter((f) => f.endsWith('.browser.ts')).sort()) {
  if (existsSync(`test/bench/${f}`)) run(['--import', 'tsx', `test/bench/${f}`]);
}
