// Migration 6 (office/receiver/migrations.ts): on a PostgreSQL server with LZ4, bundle documents are stored
// compressed with it, documents stored before keep their method, and both read back whole. Checked against
// the server's own catalogue (pg_attribute.attcompression) and pg_column_compression().
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { Database } from '../../office/receiver/db';
import { openPostgres } from '../../office/receiver/db';
import { createDevice } from '../../office/receiver/devices';
import { migrate } from '../../office/receiver/migrations';
import { storeBundle } from '../../office/receiver/store';
import { bundleOf, readingRecords } from '../support/office/phones';
import { describeOnPostgres, throwawayDatabase } from '../support/office/postgres';

describeOnPostgres('migration-lz4.test.ts', 'bundle documents compressed with LZ4 (migration 6)', () => {
  let db: Database;
  let drop: () => Promise<void>;

  beforeAll(async () => {
    const made = await throwawayDatabase('freshet_lz4');
    drop = made.drop;
    db = await openPostgres(made.url, 2);
  }, 60_000);
  afterAll(async () => {
    await db?.close();
    await drop?.();
  });

  const documentOf = async (id: string) =>
    (await db.query<{ document: string; how: string | null }>('select document, pg_column_compression(document) as how from office_bundles where id = $1', [id]))[0];

  it('keeps documents stored before it as they were, and stores new ones with LZ4 when the server has it', async () => {
    await migrate(db, 5);
    await createDevice(db, 'lz4 phone');
    const [d] = await db.query<{ device_no: number }>("select device_no from office_devices where name = 'lz4 phone'");
    const before = bundleOf('lz4', readingRecords('lz4', 120, 0));
    await storeBundle(db, before, Number(d.device_no));
    expect(await migrate(db)).toEqual([6]);
    const after = bundleOf('lz4', readingRecords('lz4', 120, 200));
    await storeBundle(db, after, Number(d.device_no));

    const [{ has }] = await db.query<{ has: boolean }>(
      "select exists (select 1 from pg_settings where name = 'default_toast_compression' and 'lz4' = any(enumvals)) as has",
    );
    const [{ method }] = await db.query<{ method: string }>(
      "select attcompression::text as method from pg_attribute where attrelid = 'office_bundles'::regclass and attname = 'document'",
    );
    // 'l' is LZ4 in the catalogue; '' is the server's default method.
    expect(method).toBe(has ? 'l' : '');
    const old = await documentOf(before.id);
    const now = await documentOf(after.id);
    expect(old.how).toBe('pglz');
    expect(now.how).toBe(has ? 'lz4' : 'pglz');
    expect(JSON.parse(old.document)).toEqual(JSON.parse(JSON.stringify(before)));
    expect(JSON.parse(now.document)).toEqual(JSON.parse(JSON.stringify(after)));
  });
});
