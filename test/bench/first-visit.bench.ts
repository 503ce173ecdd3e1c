// Benchmark figure: gzip bytes of JS and CSS that the first visit of the built app loads, beside its floor:
// the framework every screen needs (Preact and its hooks, as shipped, gzip level 9 like the measurement).
import { readFileSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import { startPreview } from '../support/browser/harness';
import { FIRST_VISIT_BUDGET_BYTES, measureFirstVisit } from '../support/browser/first-visit';
import { figure } from './measure';

const FRAMEWORK = ['node_modules/preact/dist/preact.mjs', 'node_modules/preact/hooks/dist/hooks.mjs'];

const server = await startPreview(4185);
try {
  const { files, total_gzip_bytes } = await measureFirstVisit(server.url);
  const floorBytes = FRAMEWORK.reduce((s, f) => s + gzipSync(readFileSync(f), { level: 9 }).length, 0);
  figure({
    name: 'first-visit-js-css-gzip',
    value: total_gzip_bytes / 1024,
    unit: 'KiB',
    floor: floorBytes / 1024,
    floor_is: 'Preact and its hooks as shipped, gzip: the least any screen of the app loads',
    target: 'value <= 45 KiB',
    budget_kib: FIRST_VISIT_BUDGET_BYTES / 1024,
    files: files.map((f) => ({ file: new URL(f.url).pathname, gzip_bytes: f.gzip_bytes })),
  });
} finally {
  await server.stop();
}
