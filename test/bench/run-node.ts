// Runs every Node benchmark (test/bench/*.node.ts, each a default-exported async function that emits
// JSON lines) in file-name order.
import { readdirSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { dirname, join } from 'node:path';

const here = dirname(fileURLToPath(import.meta.url));
const files = readdirSync(here).filter((f) => f.endsWith('.node.ts')).sort();
for (const f of files) {
  const mod = (await import(pathToFileURL(join(here, f)).href)) as { default: () => Promise<void> | void };
  await mod.default();
}
