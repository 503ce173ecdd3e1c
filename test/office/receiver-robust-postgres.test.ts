// The receiver's robustness tests on a PostgreSQL server (a throwaway database on FRESHET_TEST_POSTGRES_URL).
import { describe, it } from 'vitest';
import { openOfficeDatabase } from '../../office/receiver/open';
import { describeRobustness } from '../support/office/robustness-suite';
import { POSTGRES_URL, skipWithoutPostgres, throwawayDatabase } from '../support/office/postgres';

if (skipWithoutPostgres('receiver-robust-postgres.test.ts')) {
  describe('office receiver robustness on PostgreSQL', () => {
    it.skip('needs a PostgreSQL server: set FRESHET_TEST_POSTGRES_URL (.ci/run starts one)', () => {});
  });
} else {
  let drop: (() => Promise<void>) | undefined;
  describeRobustness({
    name: `PostgreSQL (${new URL(POSTGRES_URL as string).host})`,
    port: 4642,
    open: async () => {
      const made = await throwawayDatabase('freshet_robust');
      drop = made.drop;
      return openOfficeDatabase({ database: made.url });
    },
    dispose: async () => drop?.(),
  });
}
