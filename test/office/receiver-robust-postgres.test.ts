// The receiver's robustness tests on a PostgreSQL server (a throwaway database on FRESHET_TEST_POSTGRES_URL).
import { onPostgres } from '../support/office/receiver-under-test';
import { describeRobustness } from '../support/office/robustness-suite';

onPostgres('receiver-robust-postgres.test.ts', 'office receiver robustness on PostgreSQL', 4642, 'freshet_robust', describeRobustness);
