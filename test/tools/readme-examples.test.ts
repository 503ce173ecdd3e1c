// The README's command examples run as written, through a real shell (quoting, globs, redirection),
// with `npx freshet` standing for `node bin/freshet.mjs` and under umask 027, in a temp folder: both
// blocks, "For the office: the `freshet` command" and "The office receiver". A serving line is started,
// waited for and stopped; a line with a placeholder (<command>) is not run; the PostgreSQL server line
// runs against a throwaway database when FRESHET_TEST_POSTGRES_URL is set. Export folders follow the
// umask (POSIX umask: 0777 & ~027 = 0750 for folders, 0666 & ~027 = 0640 for files).
import { spawn } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { bundleOf, readingRecords, siteRecord } from '../support/office/phones';
import { POSTGRES_URL, throwawayDatabase } from '../support/office/postgres';
import { REPO_ROOT } from '../support/waterml-kit';

const BIN = join(REPO_ROOT, 'bin', 'freshet.mjs');
const dir = mkdtempSync(join(tmpdir(), 'freshet-readme-'));
const drops: (() => Promise<void>)[] = [];
afterAll(async () => {
  for (const d of drops) await d();
  rmSync(dir, { recursive: true, force: true });
});

/** The `npx freshet …` lines of the README's sh blocks, in order. */
function exampleLines(): string[] {
  const text = readFileSync(join(REPO_ROOT, 'README.md'), 'utf8');
  const blocks = [...text.matchAll(/```sh\n([\s\S]*?)```/g)].map((m) => m[1]);
  return blocks.flatMap((b) => b.split('\n')).filter((l) => l.startsWith('npx freshet '));
}

/** Runs one line in the temp folder through sh; a serving line is stopped once it says where it listens. */
function shell(line: string, serving: boolean): Promise<{ code: number | null; out: string; err: string; listening: boolean }> {
  return new Promise((resolve, reject) => {
    const command = `umask 027; ${serving ? 'exec ' : ''}${line.replace(/^npx freshet /, `"${process.execPath}" "${BIN}" `)}`;
    const child = spawn('/bin/sh', ['-c', command], { cwd: dir });
    let out = '';
    let err = '';
    let listening = false;
    child.stdout.on('data', (d: Buffer) => {
      out += d.toString();
      if (serving && !listening && /receiver on http:\/\//.test(out)) {
        listening = true;
        child.kill('SIGTERM');
      }
    });
    child.stderr.on('data', (d: Buffer) => (err += d.toString()));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, out, err, listening }));
  });
}

describe('the README examples', () => {
  it('run as written, in order, exit 0, and the exports follow the umask', async () => {
    // A bundle file from a phone (invented site TB-02, as the README's --site examples name it).
    const b = bundleOf('readme-phone', [siteRecord('readme-phone'), ...readingRecords('readme-phone', 8)]);
    writeFileSync(join(dir, 'freshet-readme-phone-20260602-0815.json'), JSON.stringify(b));
    const lines = exampleLines();
    expect(lines.length).toBeGreaterThanOrEqual(12);
    let ran = 0;
    for (const original of lines) {
      let line = original;
      if (/<\w+>/.test(line.split(/\s#\s/)[0])) {
        console.log(`readme-examples.test.ts: not run (a placeholder): ${line}`);
        continue;
      }
      const pg = /postgres:\/\/\S+/.exec(line);
      if (pg) {
        if (!POSTGRES_URL) {
          console.log(`readme-examples.test.ts: not run (no PostgreSQL server; set FRESHET_TEST_POSTGRES_URL): ${line}`);
          continue;
        }
        const made = await throwawayDatabase('freshet_readme');
        drops.push(made.drop);
        line = line.replace(pg[0], made.url);
      }
      const serving = /^npx freshet office (--data|--database)/.test(line);
      const r = await shell(line, serving);
      expect({ line, code: r.code, err: r.code === 0 ? '' : r.err }).toEqual({ line, code: 0, err: '' });
      if (serving) expect(r.listening).toBe(true);
      if (line.includes('office token')) {
        // The token alone on stdout (for scripts), the next steps with it on the terminal.
        expect(r.out.trim()).toMatch(/^[A-Za-z0-9_-]{43}$/);
        expect(r.err).toMatch(/Creating the office database/);
        expect(r.err).toMatch(/"Token for this phone"/);
        expect(r.err).toMatch(/"Office address"/);
        expect(r.err).toMatch(/WITHOUT \/bundles at the end/);
      }
      ran++;
    }
    expect(ran).toBeGreaterThanOrEqual(10);
    // Export folders and files follow the umask (027 here), not a fixed 0700.
    for (const folder of ['tables', 'exports/tb-02', 'exports/tb-02-wml', 'exports/tb-02-photos']) {
      expect((statSync(join(dir, folder)).mode & 0o777).toString(8)).toBe('750');
      for (const f of readdirSync(join(dir, folder))) expect((statSync(join(dir, folder, f)).mode & 0o777).toString(8)).toBe('640');
    }
  }, 300_000);
});
