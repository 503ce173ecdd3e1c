// Browser-test harness: serves a built folder with `vite preview` and drives Debian Chromium through
// playwright-core with a fresh profile per launch.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';

export const ROOT = resolve(import.meta.dirname, '../../..');

/** Chromium to drive: $CHROMIUM_PATH, else the first of the usual Debian/Ubuntu/Chrome paths. */
export function chromiumPath(): string {
  const candidates = [
    process.env.CHROMIUM_PATH,
    '/usr/bin/chromium',
    '/usr/bin/chromium-browser',
    '/usr/bin/google-chrome',
    '/usr/bin/google-chrome-stable',
  ].filter((p): p is string => !!p);
  const found = candidates.find((p) => existsSync(p));
  if (!found) throw new Error('No Chromium found: set CHROMIUM_PATH or run `apt-get install -y chromium`');
  return found;
}

export interface Preview {
  url: string;
  stop(): Promise<void>;
}

/** Serves `outDir` (relative to the repo root) with `vite preview` on 127.0.0.1:`port`.
 * Avoid ports on the fetch standard's blocked list (4190, 6000, 6665–6669, …): browsers and Node refuse them. */
export async function startPreview(port: number, outDir = 'dist'): Promise<Preview> {
  const child: ChildProcess = spawn(
    process.execPath,
    [join(ROOT, 'node_modules/vite/bin/vite.js'), 'preview', '--host', '127.0.0.1', '--port', String(port),
      '--strictPort', '--outDir', resolve(ROOT, outDir)],
    { cwd: ROOT, stdio: ['ignore', 'pipe', 'pipe'] },
  );
  const url = `http://127.0.0.1:${port}/`;
  let log = '';
  child.stdout?.on('data', (d) => (log += String(d)));
  child.stderr?.on('data', (d) => (log += String(d)));
  const deadline = Date.now() + 20_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`vite preview exited early:\n${log}`);
    try {
      const res = await fetch(url);
      if (res.ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      child.kill();
      throw new Error(`vite preview did not answer on ${url} within 20 s:\n${log}`);
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  return {
    url,
    stop: () =>
      new Promise<void>((done) => {
        if (child.exitCode !== null) return done();
        child.once('exit', () => done());
        child.kill();
      }),
  };
}

export interface Browser {
  context: BrowserContext;
  close(): Promise<void>;
}

/** A fresh, empty browser profile folder (for a test that restarts the browser on the same profile). */
export function freshProfile(): string {
  return mkdtempSync(join(tmpdir(), 'freshet-profile-'));
}

/**
 * Launches Chromium headless with a fresh profile (or `profile`, kept on close, for a test that kills
 * and restarts the browser on it); viewport defaults to a 360×640 phone. `serviceWorkers: 'block'` keeps
 * every page uncontrolled, as on a first visit before the app is held on the phone.
 */
export async function launchBrowser(
  options: { width?: number; height?: number; touch?: boolean; profile?: string; serviceWorkers?: 'allow' | 'block' } = {},
): Promise<Browser> {
  const profile = options.profile ?? freshProfile();
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: chromiumPath(),
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
      '--disable-component-update', '--disable-sync'],
    serviceWorkers: options.serviceWorkers ?? 'allow',
    viewport: { width: options.width ?? 360, height: options.height ?? 640 },
    hasTouch: options.touch ?? true,
    isMobile: false,
    deviceScaleFactor: 1,
  });
  return {
    context,
    close: async () => {
      await context.close();
      if (!options.profile) rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Folder where browser tests save screenshots and other artifacts. */
export const ARTIFACTS = join(ROOT, 'test-results');
