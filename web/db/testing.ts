// Hooks for tests and benchmarks only: a fresh database, a fixed clock, no listeners left behind.
import { closeDbForTests, deleteFreshetDbForTests } from './connection';
import { setClockForTests } from './clock';
import { resetEventsForTests } from './events';
import { resetPersistForTests } from './persist';

export { closeDbForTests, deleteFreshetDbForTests, setClockForTests };

/** Closes and deletes the database and forgets the clock, listeners and the persistence request. */
export async function resetDbForTests(): Promise<void> {
  await deleteFreshetDbForTests();
  setClockForTests(undefined);
  resetEventsForTests();
  resetPersistForTests();
}
