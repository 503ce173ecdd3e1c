// Storing on a PostgreSQL server (office/receiver/store.ts): the session function reads the document, then
// waits for the push lock, then stores with a snapshot taken after the lock. Checked by holding the lock in
// another push's open transaction: the waiting push must see that push's version once it commits (a revision
// reused with other content is refused, not silently skipped) and must number its bundle after it. The rule it
// rests on: a VOLATILE function takes a fresh snapshot for each statement it runs (PostgreSQL documentation,
// "Function Volatility Categories").
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { Database } from '../../office/receiver/db';
import { openPostgres } from '../../office/receiver/db';
import { createDevice } from '../../office/receiver/devices';
import { migrate } from '../../office/receiver/migrations';
import { IntegrityError, storeBundle, type StoreOutcome } from '../../office/receiver/store';
import { bundleOf, readingRecords } from '../support/office/phones';
import { describeOnPostgres, throwawayDatabase } from '../support/office/postgres';

describeOnPostgres('store-server-lock.test.ts', 'storing on a server behind the push lock', () => {
  let db: Database;
  let drop: () => Promise<void>;
  let device = 0;

  beforeAll(async () => {
    const made = await throwawayDatabase('freshet_lock');
    drop = made.drop;
    db = await openPostgres(made.url, 4);
    await migrate(db);
    await createDevice(db, 'lock phone');
    device = Number((await db.query<{ device_no: number }>("select device_no from office_devices where name = 'lock phone'"))[0].device_no);
  }, 60_000);
  afterAll(async () => {
    await db?.close();
    await drop?.();
  });

  /** Resolves once some connection waits for an advisory lock (the waiting push has read its JSON and stopped there). */
  async function someoneWaitsForTheLock(): Promise<void> {
    for (let i = 0; i < 200; i++) {
      const [w] = await db.query<{ n: string }>("select count(*)::text as n from pg_locks where locktype = 'advisory' and not granted");
      if (Number(w.n) > 0) return;
      await new Promise((r) => setTimeout(r, 25));
    }
    throw new Error('no push came to wait for the lock within 5 s');
  }

  it('a push waiting for the lock sees the push that held it: a reused revision is refused, and it is numbered after', async () => {
    const records = readingRecords('lock-a', 20, 0);
    const first = bundleOf('lock-a', records);
    const changed = structuredClone(records[7]);
    (changed.body as { stage_m: number }).stage_m += 0.5;
    const second = bundleOf('lock-b', [...readingRecords('lock-b', 5, 500), changed]);
    let waiting: Promise<StoreOutcome> | undefined;
    const stored = await storeBundle(db, first, device, {
      // Inside the first push's transaction, holding the lock, its versions written but not committed.
      beforeCommit: async () => {
        waiting = storeBundle(db, second, device);
        waiting.catch(() => undefined);
        await someoneWaitsForTheLock();
      },
    });
    expect(stored.status).toBe('stored');
    await expect(waiting).rejects.toBeInstanceOf(IntegrityError);
    await expect(waiting).rejects.toThrow(/revision .* different content/);
    const [kept] = await db.query<{ stage: number }>("select (body ->> 'stage_m')::float8 as stage from record_versions where id = $1", [records[7].id]);
    expect(kept.stage).toBe((records[7].body as { stage_m: number }).stage_m);
    expect(await db.query('select 1 from office_bundles where id = $1', [second.id])).toEqual([]);
  });

  it('a clean push that waited for the lock is numbered after the push that held it', async () => {
    const first = bundleOf('lock-c', readingRecords('lock-c', 10, 1000));
    const second = bundleOf('lock-d', readingRecords('lock-d', 10, 2000));
    let waiting: Promise<StoreOutcome> | undefined;
    const stored = await storeBundle(db, first, device, {
      beforeCommit: async () => {
        waiting = storeBundle(db, second, device);
        await someoneWaitsForTheLock();
      },
    });
    const after = await waiting!;
    expect(stored.status).toBe('stored');
    expect(after.status).toBe('stored');
    expect(after.seq).toBeGreaterThan(stored.seq);
  });
});
