// The embedded database in its own thread (office/receiver/pglite-thread.ts): one thing at a time on the
// engine. A bundle stored by its one statement while another caller's transaction is open must wait for
// that transaction, and must not be undone when that transaction rolls back; errors keep the database's
// own fields (SQLSTATE code), which the receiver's refusals are built on.
import { expect, it } from 'vitest';
import { storeBundle } from '../../office/receiver/store';
import { bundleOf, readingRecords } from '../support/office/phones';
import { useOfficeFolder } from '../support/office/office-folder';

const office = useOfficeFolder('freshet-office-thread-', 'thread phone');

const count = async (table: string) => Number((await office.db.query<{ n: string }>(`select count(*)::text as n from ${table}`))[0].n);

it('stores a bundle sent while another transaction is open after that transaction, and keeps it when that one rolls back', async () => {
  let release: () => void = () => {};
  const held = new Promise<void>((resolve) => (release = resolve));
  let inside = false;
  const other = office.db.transaction(async (tx) => {
    await tx.query(`insert into office_devices (name, token_hash) values ('rolled back', 'x')`);
    inside = true;
    await held;
    throw new Error('rolled back on purpose');
  });
  while (!inside) await new Promise((r) => setTimeout(r, 5));
  const bundle = bundleOf('dev-a', readingRecords('dev-a', 20));
  const stored = storeBundle(office.db, bundle, office.deviceNo);
  // The statement waits for the open transaction rather than running inside it.
  const early = await Promise.race([stored.then(() => 'stored'), new Promise((r) => setTimeout(() => r('waiting'), 300))]);
  expect(early).toBe('waiting');
  release();
  await expect(other).rejects.toThrow('rolled back on purpose');
  expect(await stored).toMatchObject({ status: 'stored', newVersions: 20 });
  expect(await count('office_bundles')).toBe(1);
  expect(await count('record_versions')).toBe(20);
  expect((await office.db.query(`select 1 from office_devices where name = 'rolled back'`)).length).toBe(0);
}, 60_000);

it('hands back the database\'s error with its SQLSTATE code, and answers again after it', async () => {
  const err = await office.db.query(`select 'not a number'::int`).catch((e: unknown) => e);
  expect(err).toBeInstanceOf(Error);
  expect((err as { code?: string }).code).toBe('22P02');
  expect(await office.db.query<{ one: number }>('select 1 as one')).toEqual([{ one: 1 }]);
  expect(office.db.lost?.()).toBe(false);
}, 60_000);
