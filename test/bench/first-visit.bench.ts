// Benchmark figure: gzip bytes of JS and CSS that the first visit of the built app loads.
import { startPreview } from '../support/browser/harness';
import { FIRST_VISIT_BUDGET_BYTES, measureFirstVisit } from '../support/browser/first-visit';
import { emit } from './measure';

const server = await startPreview(4185);
try {
  const { files, total_gzip_bytes } = await measureFirstVisit(server.url);
  emit({
    name: 'first-visit-js-css-gzip',
    value_kib: Number((total_gzip_bytes / 1024).toFixed(2)),
    budget_kib: FIRST_VISIT_BUDGET_BYTES / 1024,
    ratio_to_budget: Number((total_gzip_bytes / FIRST_VISIT_BUDGET_BYTES).toFixed(3)),
    files: files.map((f) => ({ file: new URL(f.url).pathname, gzip_bytes: f.gzip_bytes })),
  });
} finally {
  await server.stop();
}
