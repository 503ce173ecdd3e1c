// The `freshet` office command end to end: spawned as `node bin/freshet.mjs …` as npx runs it. Bundles
// are checked by core's parseBundle; the WaterML written is validated by the OGC schema kit (xmllint) and
// the CSV read back by papaparse (test-only oracles).
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { parseBundle, type Bundle } from '../../core';
import { REPO_ROOT, validateWaterml } from '../support/waterml-kit';

const BIN = join(REPO_ROOT, 'bin', 'freshet.mjs');

/** Runs `freshet args…` in cwd; resolves with its exit status and output. */
function freshet(args: string[], cwd: string): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [BIN, ...args], { cwd });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d) => (stdout += d));
    child.stderr.on('data', (d) => (stderr += d));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, stdout, stderr }));
  });
}

let dir: string;
let demo: Bundle;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'freshet-cli-'));
  const r = await freshet(['demo', '--end', '2026-11-20T19:00:00+13:00'], dir);
  expect(r.stderr).toBe('');
  expect(r.code).toBe(0);
  writeFileSync(join(dir, 'demo.json'), r.stdout);
  demo = parseBundle(JSON.parse(r.stdout));
}, 60_000);

describe('freshet demo', () => {
  it('writes the invented demo site as a bundle that core accepts', () => {
    const kinds = demo.records.map((r) => r.kind);
    expect(kinds.filter((k) => k === 'site')).toHaveLength(1);
    expect(kinds.filter((k) => k === 'rating')).toHaveLength(1);
    expect(kinds.filter((k) => k === 'gauging')).toHaveLength(12);
    const readings = demo.records.filter((r) => r.kind === 'reading');
    expect(readings.length).toBe(6); // six staff checks beside the logger (demo model)
    // The 15-minute logger record as logger days, one record per UTC day, as a logger import stores it.
    const days = demo.records.flatMap((r) => (r.kind === 'logger-day' ? [r.body] : []));
    expect(days.reduce((n, d) => n + d.offset_ms.length, 0)).toBe(21 * 96 + 1);
    const lastDay = days[days.length - 1];
    const last = lastDay.day * 86_400_000 + lastDay.offset_ms[lastDay.offset_ms.length - 1];
    expect(new Date(last).toISOString()).toBe('2026-11-20T06:00:00.000Z'); // --end, rounded to the quarter hour
  });
});

describe('freshet check', { timeout: 90_000 }, () => {
  it('summarises a good bundle', async () => {
    const r = await freshet(['check', 'demo.json'], dir);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/a good bundle/);
    expect(r.stdout).toMatch(/site PB-03 .*2023 readings.*12 gaugings; 1 rating$/m);
  });

  it.each([
    ['not JSON', '{"format": "freshet-bundle", ', /not valid JSON/],
    ['another format', JSON.stringify({ format: 'something-else' }), /not a Freshet bundle/],
    ['a newer version', (b: Bundle) => JSON.stringify({ ...b, version: 2 }), /newer version/],
    ['a damaged record', (b: Bundle) => JSON.stringify(b).replace('"stage_m":0.3', '"stage_m":0.4'), /do not match its checksum/],
  ])('refuses %s with one line and exit status 1', async (_what, content, message) => {
    const name = `bad-${Math.random().toString(36).slice(2)}.json`;
    writeFileSync(join(dir, name), typeof content === 'string' ? content : content(demo));
    const r = await freshet(['check', name], dir);
    expect(r.code).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(message);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
  });

  it('says so plainly when the file is missing or the arguments are wrong', async () => {
    const [missing, extra, unknown] = await Promise.all([
      freshet(['check', 'nope.json'], dir), freshet(['check', 'a.json', 'b.json'], dir), freshet(['frobnicate'], dir),
    ]);
    expect([missing.code, missing.stderr]).toEqual([1, 'freshet check: cannot read nope.json: no such file\n']);
    expect(extra.code).toBe(2);
    expect(extra.stderr).toMatch(/^freshet check: expected <bundle.json>; got "a.json" "b.json"/);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toMatch(/unknown command "frobnicate"/);
  });
});

// Each spawn starts Node and tsx (seconds on a busy machine): these tests get a longer timeout.
describe('freshet waterml and csv', { timeout: 90_000 }, () => {
  it('writes Part 1 and Part 2 documents that validate against the OGC schemas', async () => {
    const r = await freshet(['waterml', 'demo.json', '--out', 'wml'], dir);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const files = readdirSync(join(dir, 'wml')).sort();
    expect(files).toEqual(['PB-03_ratings.xml', 'PB-03_timeseries.xml']);
    const v = validateWaterml(files.map((f) => join(dir, 'wml', f)));
    expect(v.output).toMatch(/PB-03_ratings.xml: valid \(WaterML 2.0 Part 2/);
    expect(v.output).toMatch(/PB-03_timeseries.xml: valid \(WaterML 2.0 Part 1/);
    expect(v.status).toBe(0);
  });

  it('writes the CSV tables, which papaparse reads back', async () => {
    const r = await freshet(['csv', 'demo.json', '--out', 'tables'], dir);
    expect(r.code).toBe(0);
    expect(readdirSync(join(dir, 'tables')).sort()).toEqual(['PB-03_gauging_verticals.csv', 'PB-03_gaugings.csv', 'PB-03_rating_segments.csv', 'PB-03_rating_tables.csv', 'PB-03_readings.csv']);
    const text = readFileSync(join(dir, 'tables', 'PB-03_readings.csv'), 'utf8');
    const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data).toHaveLength(2023);
    expect(parsed.data[0].time).toMatch(/\+13:00$/); // NZDT in November, IANA tz database
  });

  it('writes nothing into a folder that already holds files, and nothing at all on a bad bundle', async () => {
    mkdirSync(join(dir, 'busy'));
    writeFileSync(join(dir, 'busy', 'keep.txt'), 'mine');
    const busy = await freshet(['csv', 'demo.json', '--out', 'busy'], dir);
    expect(busy.code).toBe(1);
    expect(busy.stderr).toMatch(/already holds files/);
    expect(readdirSync(join(dir, 'busy'))).toEqual(['keep.txt']);
    writeFileSync(join(dir, 'broken.json'), JSON.stringify({ ...demo, checksum: 'sha256:' + '0'.repeat(64) }));
    const bad = await freshet(['waterml', 'broken.json', '--out', 'never'], dir);
    expect(bad.code).toBe(1);
    expect(bad.stderr.trim().split('\n')).toHaveLength(1);
    expect(existsSync(join(dir, 'never'))).toBe(false);
    expect(readdirSync(dir).filter((f) => f.includes('partial'))).toEqual([]);
    const noOut = await freshet(['csv', 'demo.json'], dir);
    expect([noOut.code, noOut.stderr]).toEqual([2, 'freshet csv: --out <dir> is required (try freshet csv --help)\n']);
  });

  it('has --help on every command', async () => {
    const commands = ['demo', 'check', 'waterml', 'csv'];
    const [top, ...each] = await Promise.all([freshet(['--help'], dir), ...commands.map((c) => freshet([c, '--help'], dir))]);
    each.forEach((r, i) => {
      expect(r.code).toBe(0);
      expect(r.stdout).toMatch(new RegExp(`^Usage: freshet ${commands[i]}`));
    });
    expect(top.stdout).toMatch(/Commands:\n {2}demo/);
  });
});
