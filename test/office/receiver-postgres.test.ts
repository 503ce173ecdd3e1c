// The same protocol tests against a PostgreSQL server (a throwaway database on FRESHET_TEST_POSTGRES_URL).
import { describe, it } from 'vitest';
import { openOfficeDatabase } from '../../office/receiver/open';
import { describeProtocol } from '../support/office/protocol-suite';
import { POSTGRES_URL, skipWithoutPostgres, throwawayDatabase } from '../support/office/postgres';

if (skipWithoutPostgres('receiver-postgres.test.ts')) {
  describe('office receiver on PostgreSQL', () => {
    it.skip('needs a PostgreSQL server: set FRESHET_TEST_POSTGRES_URL (.ci/run starts one)', () => {});
  });
} else {
  let drop: (() => Promise<void>) | undefined;
  describeProtocol({
    name: `PostgreSQL (${new URL(POSTGRES_URL as string).host})`,
    port: 4582,
    open: async () => {
      const made = await throwawayDatabase('freshet_protocol');
      drop = made.drop;
      return openOfficeDatabase({ database: made.url });
    },
    dispose: async () => drop?.(),
  });
}
