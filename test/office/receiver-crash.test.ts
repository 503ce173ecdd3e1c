// A receiver process killed in the middle of storing a bundle stores nothing of it: on PGlite (a temp
// folder) and, when one is available, on a PostgreSQL server.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, it } from 'vitest';
import { openOfficeDatabase } from '../../office/receiver/open';
import { killWhileStoring } from './support/crash';
import { POSTGRES_URL, throwawayDatabase } from './support/postgres';

describe('office receiver killed while storing a bundle', () => {
  const dir = mkdtempSync(join(tmpdir(), 'freshet-office-crash-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('on PGlite: stores nothing of it, and takes it whole on the next push', async () => {
    await killWhileStoring(['--data', dir], 4583, () => openOfficeDatabase({ data: dir }));
  }, 180_000);

  if (POSTGRES_URL) {
    it('on PostgreSQL: stores nothing of it, and takes it whole on the next push', async () => {
      const made = await throwawayDatabase('freshet_crash');
      try {
        await killWhileStoring(['--database', made.url], 4584, () => openOfficeDatabase({ database: made.url }));
      } finally {
        await made.drop();
      }
    }, 60_000);
  } else {
    console.log('receiver-crash.test.ts: the PostgreSQL case is skipped: no server (set FRESHET_TEST_POSTGRES_URL, as .ci/run does)');
    it.skip('on PostgreSQL: needs FRESHET_TEST_POSTGRES_URL (.ci/run starts a server)', () => {});
  }
});
