// Installs dependencies with `npm ci` when they are missing or older than package-lock.json.
import { spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';

/** Runs `npm ci` if node_modules does not match package-lock.json. */
export function ensureInstall() {
  const marker = 'node_modules/.package-lock.json';
  const fresh = existsSync(marker) && statSync(marker).mtimeMs >= statSync('package-lock.json').mtimeMs;
  if (fresh) return;
  console.log('Installing dependencies (npm ci)…');
  const r = spawnSync('npm', ['ci', '--no-audit', '--no-fund'], { stdio: 'inherit' });
  if (r.status !== 0) process.exit(r.status ?? 1);
}
