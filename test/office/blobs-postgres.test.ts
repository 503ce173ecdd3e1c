// The photo-bytes endpoint against a PostgreSQL server (a throwaway database on FRESHET_TEST_POSTGRES_URL).
import { describe, it } from 'vitest';
import { openOfficeDatabase } from '../../office/receiver/open';
import { describeBlobs } from '../support/office/blob-suite';
import { POSTGRES_URL, skipWithoutPostgres, throwawayDatabase } from '../support/office/postgres';

if (skipWithoutPostgres('blobs-postgres.test.ts')) {
  describe('photo bytes on PostgreSQL', () => {
    it.skip('needs a PostgreSQL server: set FRESHET_TEST_POSTGRES_URL (.ci/run starts one)', () => {});
  });
} else {
  let drop: (() => Promise<void>) | undefined;
  describeBlobs({
    name: `PostgreSQL (${new URL(POSTGRES_URL as string).host})`,
    port: 0,
    open: async () => {
      const made = await throwawayDatabase('freshet_blobs');
      drop = made.drop;
      return openOfficeDatabase({ database: made.url });
    },
    dispose: async () => drop?.(),
  });
}
