// A receiver an office can leave running, on the embedded database (PGlite in a folder): while phones
// push, its engine is closed under it, and then another process holds the folder's lock file for a few
// seconds, so the first tries to open it again are refused. Pushes meanwhile are answered 503 with a
// Retry-After in whole seconds (RFC 9110 §10.2.3; the phone waits as told, core/exchange/README.md); the
// receiver opens the folder again once it is free and serves as before; every bundle is stored exactly
// once and nothing half-stored (PostgreSQL's own rule: a transaction that did not commit leaves nothing).
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import type { Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, expect, it } from 'vitest';
import type { Database } from '../../office/receiver/db';
import { createDevice } from '../../office/receiver/devices';
import { createReceiver } from '../../office/receiver/http';
import { keepOpen } from '../../office/receiver/keep-open';
import { openOfficeDatabase } from '../../office/receiver/open';
import { bundleOf, push, readingRecords } from '../support/office/phones';

const PORT = 4647;
const PHONES = 6;
const BUNDLES_EACH = 5;
const READINGS = 20;
/** How long the other process holds the folder's lock file, ms. */
const HOLD_MS = 3000;

const dir = mkdtempSync(join(tmpdir(), 'freshet-office-reopen-'));
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
let server: Server | undefined;
let db: Database | undefined;
let holder: ChildProcess | undefined;

afterAll(async () => {
  holder?.kill('SIGKILL');
  if (server) {
    server.closeAllConnections();
    await new Promise((r) => server?.close(r));
  }
  await db?.close();
  rmSync(dir, { recursive: true, force: true });
});

it('answers 503 with Retry-After while its embedded database is closed and its folder held by another process, then stores every bundle once', async () => {
  const opened: Database[] = [await openOfficeDatabase({ data: dir })];
  const tokens: string[] = [];
  for (let i = 0; i < PHONES; i++) tokens.push(await createDevice(opened[0], `reopen phone ${i}`));
  const logs: string[] = [];
  db = keepOpen(opened[0], async () => {
    const d = await openOfficeDatabase({ data: dir });
    opened.push(d);
    return d;
  }, { log: (l) => logs.push(l) });
  server = createReceiver({ db, origins: [], log: () => {} });
  await new Promise<void>((r) => server?.listen(PORT, '127.0.0.1', r));
  const base = `http://127.0.0.1:${PORT}`;
  // The other process: alive while it holds the lock, so the receiver must wait for it.
  holder = spawn(process.execPath, ['-e', 'setTimeout(() => {}, 60000)'], { stdio: 'ignore' });

  const statuses: number[] = [];
  const retryAfters: (string | null)[] = [];
  let stored = 0;
  const phone = async (i: number) => {
    for (let k = 0; k < BUNDLES_EACH; k++) {
      const b = bundleOf(`reopen-${i}`, readingRecords(`reopen-${i}`, READINGS, (i * BUNDLES_EACH + k) * READINGS));
      for (let attempt = 0; attempt < 60; attempt++) {
        const res = await fetch(`${base}/bundles`, {
          method: 'POST', body: JSON.stringify(b),
          headers: { Authorization: `Bearer ${tokens[i]}`, 'Content-Type': 'application/json', 'Idempotency-Key': b.id },
        });
        await res.arrayBuffer();
        statuses.push(res.status);
        if (res.status === 201 || res.status === 200) {
          stored++;
          break;
        }
        const wait = res.headers.get('retry-after');
        retryAfters.push(wait);
        // As the phone does: wait the seconds the receiver asks for.
        await sleep(/^\d+$/.test(wait ?? '') ? Number(wait) * 1000 : 1000);
      }
      await sleep(100);
    }
  };
  const load = Promise.all(Array.from({ length: PHONES }, (_, i) => phone(i)));
  while (stored < 4) await sleep(20);
  // The engine closed under the receiver (its close also lets go of the folder's lock file) …
  await opened[0].close();
  // … and at once another live process holds the folder's lock, as `freshet office` would.
  writeFileSync(join(dir, 'in-use.lock'), String(holder.pid), { flag: 'wx' });
  await sleep(HOLD_MS);
  // It ends without removing its lock: the receiver takes over a lock whose process is gone.
  holder.kill('SIGKILL');
  await new Promise((r) => holder?.once('exit', r));
  await load;

  expect(statuses.filter((s) => s !== 201 && s !== 200 && s !== 503)).toEqual([]);
  expect(statuses.filter((s) => s === 503).length).toBeGreaterThan(0);
  expect(retryAfters.filter((w) => !/^[1-9]\d*$/.test(w ?? ''))).toEqual([]);
  expect(opened.length).toBeGreaterThanOrEqual(2);
  expect(logs.some((l) => /in use by process/.test(l))).toBe(true);
  expect(logs.some((l) => /open again/.test(l))).toBe(true);
  // Every bundle and every record exactly once, each record's current version among them.
  const [n] = await db.query<{ bundles: string; versions: string; ids: string; current: string }>(
    `select (select count(*) from office_bundles)::text as bundles, (select count(*) from record_versions)::text as versions,
            (select count(distinct id) from record_versions)::text as ids, (select count(*) from current_records)::text as current`);
  expect(Number(n.bundles)).toBe(PHONES * BUNDLES_EACH);
  expect(Number(n.versions)).toBe(PHONES * BUNDLES_EACH * READINGS);
  expect(Number(n.ids)).toBe(PHONES * BUNDLES_EACH * READINGS);
  expect(Number(n.current)).toBe(PHONES * BUNDLES_EACH * READINGS);
  // And it still serves.
  expect((await push(base, tokens[0], bundleOf('reopen-0', readingRecords('reopen-0', 3, 9000)))).status).toBe(201);
}, 180_000);
