// `npm run bench`: every benchmark figure as a JSON line. Node benchmarks first (core), then the
// browser ones (bundle size, storage in Chromium) against a fresh production build.
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';

function run(cmd, args) {
  const r = spawnSync(cmd, args, { stdio: 'inherit' });
  if (r.status !== 0) process.exit(r.status ?? 1);
}
if (!existsSync('node_modules/.package-lock.json')) run('npm', ['ci', '--no-audit', '--no-fund']);
run(process.execPath, ['--expose-gc', '--import', 'tsx', 'test/bench/run-node.ts']);
