// A fresh fake IndexedDB per test and a wall clock the test can move (Node storage tests).
import 'fake-indexeddb/auto';
import { afterEach, beforeEach } from 'vitest';
import { resetDbForTests, setClockForTests } from '../../web/db/testing';
import { T0 } from './records';

/** Gives every test an empty database and a wall clock that the test can move. */
export function useFreshDb(): { clock: { now: number } } {
  const clock = { now: T0 + 86_400_000 * 365 };
  beforeEach(() => {
    clock.now = T0 + 86_400_000 * 365;
    setClockForTests(() => clock.now);
  });
  afterEach(async () => {
    await resetDbForTests();
  });
  return { clock };
}

