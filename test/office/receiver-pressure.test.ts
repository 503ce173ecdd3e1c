// Back-pressure, measured from outside the receiver process: 200 phones push a 500-reading bundle each at
// the same moment to `freshet office --max-pushes 4` (PGlite in a temp folder, 127.0.0.1). Pushes beyond the
// cap are answered 503 with Retry-After (RFC 9110 §10.2.3: a delay in whole seconds) and store nothing
// (sent again, each is taken whole: 201 with all 500 new versions, never 200 "already received"); the
// process's resident memory stays bounded while the burst lasts; in the end every record is stored once.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { existsSync } from 'node:fs';
import { afterAll, expect, it } from 'vitest';
import type { Bundle } from '../../core/index';
import { run } from '../../office/cli/index';
import { openOfficeDatabase } from '../../office/receiver/open';
import { bundleOf, readingRecords } from '../support/office/phones';
import { residentBytes, startReceiverChild } from '../support/office/receiver-child';

const PORT = 4593;
const PHONES = 200;
const READINGS = 500;
const CAP = 4;
// Growth of resident memory allowed during the burst. With the cap, one run here grew about 60 MB (the
// embedded database's own memory grows with what it stores); with no cap (every push held at once) the
// same burst grew about 200 MB. Measured on this project's test machine, not a published figure.
const GROWTH_LIMIT_BYTES = 128 * 1024 * 1024;

const dir = mkdtempSync(join(tmpdir(), 'freshet-office-pressure-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

interface Answer {
  status: number;
  retryAfter: string | null;
  body: { error?: string; status?: string; newVersions?: number };
}

async function send(base: string, token: string, b: Bundle): Promise<Answer> {
  const res = await fetch(`${base}/bundles`, {
    method: 'POST',
    body: JSON.stringify(b),
    headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json', 'Idempotency-Key': b.id },
  });
  return { status: res.status, retryAfter: res.headers.get('retry-after'), body: (await res.json()) as Answer['body'] };
}

it('answers pushes beyond the cap with 503 and Retry-After at once, stores nothing of them, and keeps memory bounded', async () => {
  let token = '';
  const code = await run(['office', 'token', 'Burst phone', '--data', dir], { stdout: (s) => (token += s), stderr: () => {}, cwd: process.cwd() });
  expect(code).toBe(0);
  token = token.trim();
  const child = await startReceiverChild(['--data', dir], PORT, ['--max-pushes', String(CAP)]);
  const bundles = Array.from({ length: PHONES }, (_, p) => bundleOf(`burst-${p}`, readingRecords(`burst-${p}`, READINGS, p * READINGS)));
  try {
    // One push first, so the database's start-up memory is in the baseline.
    const warm = bundleOf('burst-warm', readingRecords('burst-warm', READINGS, PHONES * READINGS));
    expect((await send(child.base, token, warm)).status).toBe(201);
    const baseline = residentBytes(child.pid);
    let peak = baseline;
    const sample = setInterval(() => {
      peak = Math.max(peak, residentBytes(child.pid));
    }, 10);
    let answers: Answer[];
    try {
      answers = await Promise.all(bundles.map((b) => send(child.base, token, b)));
    } finally {
      clearInterval(sample);
    }
    expect(peak - baseline).toBeLessThan(GROWTH_LIMIT_BYTES);
    expect(new Set(answers.map((a) => a.status))).toEqual(new Set([201, 503]));
    const refused = bundles.filter((_, i) => answers[i].status === 503);
    for (const a of answers.filter((x) => x.status === 503)) {
      expect(a.body.error).toBe('busy');
      expect(a.retryAfter).toMatch(/^[1-9]\d*$/);
      expect(Number(a.retryAfter)).toBeLessThanOrEqual(60);
    }
    // The phone's part, done here one at a time: each refused bundle sent again is new to the office.
    for (const b of refused) {
      const again = await send(child.base, token, b);
      expect({ status: again.status, newVersions: again.body.newVersions }).toEqual({ status: 201, newVersions: READINGS });
    }
  } finally {
    await child.stop();
  }
  const db = await openOfficeDatabase({ data: dir });
  try {
    const [n] = await db.query<{ versions: string; ids: string; bundles: string }>(
      `select count(*)::text as versions, count(distinct id)::text as ids, (select count(*) from office_bundles)::text as bundles from record_versions`);
    expect(n).toEqual({ versions: String((PHONES + 1) * READINGS), ids: String((PHONES + 1) * READINGS), bundles: String(PHONES + 1) });
  } finally {
    await db.close();
  }
}, 300_000);

it('refuses a cap that is not a whole number of pushes from 1, before opening anything', async () => {
  for (const bad of ['0', '2.5', 'many', '10001']) {
    let err = '';
    const code = await run(['office', '--data', join(dir, 'never-made'), '--max-pushes', bad], { stdout: () => {}, stderr: (s) => (err += s), cwd: process.cwd() });
    expect(code).toBe(1);
    expect(err).toContain(`--max-pushes needs a whole number of pushes from 1 to 10000; got ${bad}`);
  }
  expect(existsSync(join(dir, 'never-made'))).toBe(false);
});
