// Two receiver processes on one PostgreSQL server (two ports, as two upstreams of one proxy would be):
// phones push to both at once, one receiver is killed (SIGKILL) while pushes are in flight and started
// again, and a phone pulls from either one while this goes on. Every record is stored once, every pushed
// bundle is kept once, and every pull agrees on one cursor order: the incremental pulls, alternating between
// the two receivers, see exactly the sequence a full pull from either one gives at the end.
// Needs FRESHET_TEST_POSTGRES_URL (.ci/run starts a server); skipped with a printed reason without it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Bundle } from '../../core/index';
import type { Database } from '../../office/receiver/db';
import { createDevice } from '../../office/receiver/devices';
import { openOfficeDatabase } from '../../office/receiver/open';
import { bundleOf, pullAll, push, readingRecords } from '../support/office/phones';
import { skipWithoutPostgres, throwawayDatabase } from '../support/office/postgres';
import { startReceiverChild, type ReceiverChild } from '../support/office/receiver-child';

const PORTS = [4594, 4595] as const;
const PHONES = 8;
const BUNDLES_PER_PHONE = 12;
const READINGS = 50;
/** Receiver 0 is killed once it has stored this many bundles, with other pushes to it still in flight. */
const KILL_AFTER = 20;

if (skipWithoutPostgres('receiver-two.test.ts')) {
  describe('two receivers on one PostgreSQL server', () => {
    it.skip('needs a PostgreSQL server: set FRESHET_TEST_POSTGRES_URL (.ci/run starts one)', () => {});
  });
} else {
  describe('two receivers on one PostgreSQL server', () => {
    let made: { url: string; drop: () => Promise<void> };
    let db: Database;
    const receivers: ReceiverChild[] = [];

    beforeAll(async () => {
      made = await throwawayDatabase('freshet_two');
      // Both processes migrate the new database at once (the migration lock lets one do it).
      // Each one that started is kept for afterAll to stop, even when the other failed to start.
      const started = await Promise.allSettled(PORTS.map((port) => startReceiverChild(['--database', made.url], port)));
      for (const s of started) if (s.status === 'fulfilled') receivers.push(s.value);
      const failed = started.find((s) => s.status === 'rejected');
      if (failed) throw failed.reason;
      db = await openOfficeDatabase({ database: made.url });
    }, 120_000);

    afterAll(async () => {
      for (const r of receivers) await r.stop();
      await db?.close();
      await made?.drop();
    });

    it('stores every record once, loses nothing when one is killed mid-push, and gives every pull one cursor order', async () => {
      const tokens: string[] = [];
      for (let p = 0; p < PHONES; p++) tokens.push(await createDevice(db, `Two-receiver phone ${p}`));
      const reader = await createDevice(db, 'Reading phone');
      const work: Bundle[][] = Array.from({ length: PHONES }, (_, p) =>
        Array.from({ length: BUNDLES_PER_PHONE }, (_, k) =>
          bundleOf(`two-${p}`, readingRecords(`two-${p}`, READINGS, (p * BUNDLES_PER_PHONE + k) * READINGS))));

      let storedByFirst = 0;
      let cutMidPush = 0;
      let killed: Promise<void> | undefined;
      // A phone's push: to the receiver its turn names; on a dropped or refused connection, the same
      // bundle again to the other one (a proxy does the same), until one answers.
      const deliver = async (b: Bundle, token: string, turn: number): Promise<number> => {
        for (let attempt = 0; attempt < 20; attempt++) {
          const i = (turn + attempt) % 2;
          try {
            const { status } = await push(receivers[i].base, token, b);
            if (i === 0 && status === 201 && ++storedByFirst === KILL_AFTER) killed = receivers[0].kill();
            return status;
          } catch (err) {
            const code = (err as { cause?: { code?: string } }).cause?.code;
            if (code !== 'ECONNREFUSED') cutMidPush++;
          }
        }
        throw new Error(`bundle ${b.id} was not taken by either receiver`);
      };

      const pulled: string[] = [];
      let cursor = '0';
      let done = false;
      const pushes = Promise.all(work.map(async (bundles, p) => {
        const answers: number[] = [];
        for (const [k, b] of bundles.entries()) answers.push(await deliver(b, tokens[p], p + k));
        return answers;
      })).finally(() => {
        done = true;
      });
      // Meanwhile the reading phone pulls, switching receiver every time, and restarts receiver 0 once it is gone.
      for (let turn = 0; !done; turn++) {
        if (killed !== undefined) {
          await killed;
          killed = undefined;
          receivers[0] = await startReceiverChild(['--database', made.url], PORTS[0]);
        }
        const page = await pullAll(receivers[turn % 2].base, reader, cursor).catch(() => null);
        if (page === null || page.status !== 200) continue;
        pulled.push(...page.bundles.map((b) => b.id));
        cursor = page.cursor;
      }
      const answers = (await pushes).flat();
      if (killed !== undefined) {
        await killed;
        receivers[0] = await startReceiverChild(['--database', made.url], PORTS[0]);
      }
      pulled.push(...(await pullAll(receivers[1].base, reader, cursor)).bundles.map((b) => b.id));

      // The kill happened while pushes to receiver 0 were under way, and every bundle was answered in the end.
      expect(storedByFirst).toBeGreaterThanOrEqual(KILL_AFTER);
      expect(cutMidPush).toBeGreaterThan(0);
      expect(answers.every((s) => s === 201 || s === 200)).toBe(true);

      // Every record once; every bundle once.
      const pushed = work.flat();
      const [n] = await db.query<{ versions: string; ids: string; current: string; bundles: string; distinct_bundles: string }>(
        `select (select count(*) from record_versions)::text as versions, (select count(distinct id) from record_versions)::text as ids,
                (select count(*) from current_records)::text as current,
                (select count(*) from office_bundles)::text as bundles, (select count(distinct id) from office_bundles)::text as distinct_bundles`);
      const records = String(pushed.length * READINGS);
      expect(n).toEqual({ versions: records, ids: records, current: records, bundles: String(pushed.length), distinct_bundles: String(pushed.length) });

      // One cursor order: both receivers hand out the same full sequence, the incremental pulls saw exactly
      // it, and it is the order of the server's numbering.
      const fromFirst = (await pullAll(receivers[0].base, reader)).bundles.map((b) => b.id);
      const fromSecond = (await pullAll(receivers[1].base, reader)).bundles.map((b) => b.id);
      const bySeq = (await db.query<{ id: string }>('select id::text as id from office_bundles order by seq')).map((r) => r.id);
      expect(fromFirst).toEqual(bySeq);
      expect(fromSecond).toEqual(bySeq);
      expect(pulled).toEqual(bySeq);
      expect(new Set(bySeq)).toEqual(new Set(pushed.map((b) => b.id)));
    }, 240_000);
  });
}
