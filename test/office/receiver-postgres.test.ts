// The same protocol tests against a PostgreSQL server (a throwaway database on FRESHET_TEST_POSTGRES_URL).
import { describeProtocol } from '../support/office/protocol-suite';
import { onPostgres } from '../support/office/receiver-under-test';

onPostgres('receiver-postgres.test.ts', 'office receiver on PostgreSQL', 4582, 'freshet_protocol', describeProtocol);
