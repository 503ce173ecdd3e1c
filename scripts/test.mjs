// `npm test`: install if needed, type-check every tsconfig, run the unit tests, build, then run the
// browser tests in Chromium against the built app.
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { ensureInstall } from './ensure-install.mjs';
import { ensureChromium } from './find-chromium.mjs';
import { ensureXmllint } from './find-xmllint.mjs';

function step(title, cmd, args) {
  console.log(`\n▶ ${title}`);
  const r = spawnSync(cmd, args, { stdio: 'inherit', env: process.env });
  if (r.status !== 0) {
    console.error(`\n✗ ${title} failed`);
    process.exit(r.status ?? 1);
  }
}
const node = process.execPath;
ensureInstall();
step('Type-check (core without DOM, web, sw, tests)', 'npm', ['run', '--silent', 'typecheck']);
ensureXmllint();
const report = (name) => ['--reporter=default', '--reporter=json', `--outputFile.json=test-results/${name}.json`];
step('Unit tests (core, storage)', node, ['node_modules/vitest/vitest.mjs', 'run', ...report('unit')]);
step('Build', node, ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'warn']);
ensureChromium();
step('Browser tests (Chromium)', node, ['node_modules/vitest/vitest.mjs', 'run', '-c', 'test/browser/vitest.config.ts', ...report('browser')]);
let passed = 0;
let failed = 0;
for (const name of ['unit', 'browser']) {
  const file = `test-results/${name}.json`;
  if (!existsSync(file)) continue;
  const r = JSON.parse(readFileSync(file, 'utf8'));
  passed += r.numPassedTests;
  failed += r.numFailedTests;
}
console.log('\n✓ All tests passed (screenshots in test-results/)');
console.log(`${passed} passed, ${failed} failed`);
