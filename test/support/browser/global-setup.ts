// Builds the app once before the browser tests when there is no build yet (npm test builds it anyway).
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT } from './harness';

export default function setup(): void {
  if (existsSync(join(ROOT, 'dist/index.html'))) return;
  const r = spawnSync(process.execPath, [join(ROOT, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn'], { cwd: ROOT, stdio: 'inherit' });
  if (r.status !== 0) throw new Error('vite build failed before the browser tests');
}
