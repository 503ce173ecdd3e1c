// A receiver an office can leave running: its PostgreSQL server is stopped hard (pg_ctl -m immediate,
// every connection cut) and started again while phones push. The receiver process must keep running,
// answer 503 with Retry-After while the database is away (core/exchange/README.md: the phone tries again
// later), and store every bundle exactly once when it is back. The test runs its own cluster, since it
// stops it; skipped with a printed reason where the PostgreSQL binaries are missing.
import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, describe, expect, it } from 'vitest';
import { openPostgres } from '../../office/receiver/db';
import { createDevice } from '../../office/receiver/devices';
import { openOfficeDatabase } from '../../office/receiver/open';
import { bundleOf, push, readingRecords } from '../support/office/phones';
import { ownClusterMissing, startOwnCluster, type OwnCluster } from '../support/office/own-cluster';

const PG_PORT = 4643;
const PORT = 4644;
const PHONES = 8;
const BUNDLES_EACH = 6;
const missing = ownClusterMissing();

function startReceiver(url: string): Promise<{ child: ChildProcess; stderr: () => string }> {
  const child = spawn(process.execPath, ['bin/freshet.mjs', 'office', '--database', url, '--port', String(PORT)], { stdio: ['ignore', 'pipe', 'pipe'] });
  let err = '';
  child.stderr?.on('data', (d: Buffer) => (err += d.toString()));
  return new Promise((resolve, reject) => {
    let out = '';
    const onData = (d: Buffer) => {
      out += d.toString();
      if (out.includes('receiver on http://127.0.0.1')) {
        child.stdout?.off('data', onData);
        child.stdout?.resume();
        resolve({ child, stderr: () => err });
      }
    };
    child.stdout?.on('data', onData);
    child.once('exit', (code) => reject(new Error(`receiver exited (${code}): ${err}`)));
  });
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

if (missing) {
  console.log(`receiver-restart.test.ts: skipped: ${missing}`);
  describe('office receiver while its PostgreSQL server restarts', () => {
    it.skip(`needs its own PostgreSQL cluster: ${missing}`, () => {});
  });
} else {
  describe('office receiver while its PostgreSQL server restarts', () => {
    let cluster: OwnCluster | undefined;
    let receiver: ChildProcess | undefined;
    afterAll(() => {
      receiver?.kill('SIGKILL');
      cluster?.remove();
    });

    it('survives the connection of a transaction being cut between two of its statements, and serves again after the restart', async () => {
      cluster = startOwnCluster(PG_PORT);
      const db = await openPostgres(cluster.url, 2);
      const c = cluster;
      // pg reports a connection lost while no query runs as an 'error' event on the client: unhandled, it
      // would end the process (Node.js manual, events: "error" events with no listener are thrown).
      await expect(db.transaction(async (tx) => {
        await tx.query('select 1');
        c.stopImmediately();
        await sleep(500);
        await tx.query('select 1');
      })).rejects.toThrow();
      await expect(db.query('select 1')).rejects.toThrow();
      c.start();
      expect(await db.query<{ n: number }>('select 1 as n')).toEqual([{ n: 1 }]);
      await db.close();
      cluster.remove();
      cluster = undefined;
    }, 60_000);

    it(`keeps running through pg_ctl -m immediate stop and start under ${PHONES} pushing phones, answering 503 with Retry-After meanwhile`, async () => {
      cluster = startOwnCluster(PG_PORT);
      const db = await openOfficeDatabase({ database: cluster.url });
      const tokens: string[] = [];
      for (let i = 0; i < PHONES; i++) tokens.push(await createDevice(db, `load phone ${i}`));
      await db.close();
      const started = await startReceiver(cluster.url);
      receiver = started.child;
      const base = `http://127.0.0.1:${PORT}`;

      const statuses: number[] = [];
      let retryAfterMissing = 0;
      let noAnswer = 0;
      const phone = async (i: number) => {
        for (let k = 0; k < BUNDLES_EACH; k++) {
          const b = bundleOf(`dev-${i}`, readingRecords(`dev-${i}`, 20, (i * BUNDLES_EACH + k) * 20));
          for (let attempt = 0; attempt < 400; attempt++) {
            let status = 0;
            try {
              const res = await fetch(`${base}/bundles`, {
                method: 'POST', body: JSON.stringify(b),
                headers: { Authorization: `Bearer ${tokens[i]}`, 'Content-Type': 'application/json', 'Idempotency-Key': b.id },
              });
              status = res.status;
              if (status === 503 && !/^\d+$/.test(res.headers.get('retry-after') ?? '')) retryAfterMissing++;
              await res.arrayBuffer();
            } catch {
              noAnswer++;
            }
            statuses.push(status);
            if (status === 201 || status === 200) break;
            await sleep(100);
          }
          await sleep(150);
        }
      };
      const load = Promise.all(Array.from({ length: PHONES }, (_, i) => phone(i)));
      await sleep(800);
      cluster.stopImmediately();
      await sleep(2500);
      cluster.start();
      await load;

      expect(receiver.exitCode).toBeNull();
      expect(started.stderr()).not.toMatch(/Unhandled|uncaught/i);
      expect(noAnswer).toBe(0);
      expect(statuses.filter((s) => s === 503).length).toBeGreaterThan(0);
      expect(retryAfterMissing).toBe(0);
      expect(statuses.filter((s) => s !== 201 && s !== 200 && s !== 503)).toEqual([]);
      // Every bundle stored exactly once, nothing half-stored.
      const check = await openOfficeDatabase({ database: cluster.url });
      const [n] = await check.query<{ bundles: string; versions: string }>(
        'select (select count(*) from office_bundles)::text as bundles, (select count(*) from record_versions)::text as versions');
      await check.close();
      expect(Number(n.bundles)).toBe(PHONES * BUNDLES_EACH);
      expect(Number(n.versions)).toBe(PHONES * BUNDLES_EACH * 20);
      // And it still serves: one more push after the restart.
      expect((await push(base, tokens[0], bundleOf('dev-0', readingRecords('dev-0', 3, 9000)))).status).toBe(201);
    }, 120_000);
  });
}
