// A test file's own office database: PGlite in a temp folder with one registered device, opened before the
// file's tests and closed and removed after them.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll } from 'vitest';
import type { Database } from '../../../office/receiver/db';
import { createDevice } from '../../../office/receiver/devices';
import { openOfficeDatabase } from '../../../office/receiver/open';

/** The database and the device number of the one device, once the file's tests run. */
export interface OfficeFolder {
  readonly db: Database;
  readonly deviceNo: number;
}

/** Registers the hooks that open the folder (temp folder named from `prefix`) with device `deviceName`, and remove it. */
export function useOfficeFolder(prefix: string, deviceName: string): OfficeFolder {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  let db: Database | undefined;
  let deviceNo = 0;
  beforeAll(async () => {
    db = await openOfficeDatabase({ data: dir });
    await createDevice(db, deviceName);
    const [d] = await db.query<{ device_no: number }>('select device_no from office_devices where name = $1', [deviceName]);
    deviceNo = Number(d.device_no);
  }, 120_000);
  afterAll(async () => {
    await db?.close();
    rmSync(dir, { recursive: true, force: true });
  });
  return {
    get db() {
      if (db === undefined) throw new Error('the office folder is opened in beforeAll');
      return db;
    },
    get deviceNo() {
      return deviceNo;
    },
  };
}
