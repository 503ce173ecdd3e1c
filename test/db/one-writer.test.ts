// One writer per store (web/db/stores.ts, the one table of the stores): no module but a store's writer
// puts, adds, deletes or clears in it, so derived stores (series) and the revision clock can never be left
// behind. And no module but web/db/readings-write.ts opens a readwrite transaction on `readings` (nor
// uses idb's shortcuts on it). Checked with the TypeScript compiler's own types (test/support/store-writes.ts):
// a store argument's type must not admit the store (a type parameter counts by its constraint; a plain
// string counts as "may be any store").
import { describe, expect, it } from 'vitest';
import { STORES, STORE_NAMES, type StoreName } from '../../web/db/stores';
import { sources, storeWrites, type StoreWrite } from '../support/store-writes';

const READINGS_WRITER = STORES.readings.writer;
const FIXTURE = 'test/support/forbidden-readings-writes.ts';
const APP = [...sources('web'), ...sources('core')];
const WORKER = sources('sw');
const ALL = [...APP, ...WORKER, FIXTURE];

const where = (w: StoreWrite) => `${w.file}:${w.line} ${w.method}`;
/** The writes among `found` that a module other than the store's writer makes, as "file:line method store". */
function strayWrites(found: readonly StoreWrite[]): string[] {
  return found
    .filter((w) => w.method !== 'transaction')
    .flatMap((w) => (w.stores ?? STORE_NAMES).filter((s) => STORES[s as StoreName]?.writer !== w.file).map((s) => `${where(w)} ${s}`));
}

describe('the one writer of each store', () => {
  it('finds every way of slipping in a write (so the checks below can fail)', { timeout: 180_000 }, () => {
    const found = storeWrites([FIXTURE], ALL);
    expect(found.filter((w) => w.stores === undefined || w.stores.includes('readings')).map(where)).toEqual([
      `${FIXTURE}:9 transaction`,
      `${FIXTURE}:14 transaction`,
      `${FIXTURE}:19 transaction`,
      `${FIXTURE}:24 put`,
      `${FIXTURE}:45 clear`,
    ]);
    expect(strayWrites(found).filter((s) => !s.includes(' clear '))).toEqual([
      `${FIXTURE}:24 put readings`,
      `${FIXTURE}:30 put meta`,
      `${FIXTURE}:35 delete loggerDays`,
      `${FIXTURE}:40 delete outbox`,
    ]);
    // A store the types cannot name may be any store: every store's writer is bypassed.
    expect(strayWrites(found).filter((s) => s.includes(' clear ')).length).toBe(STORE_NAMES.length);
  });

  it('no module of the app writes a store it is not the writer of', { timeout: 180_000 }, () => {
    expect(strayWrites(storeWrites(APP, ALL))).toEqual([]);
  });

  it("each store's writer in the table does write it (the table is not stale)", { timeout: 180_000 }, () => {
    const found = storeWrites(APP, ALL).filter((w) => w.method !== 'transaction');
    const unwritten = STORE_NAMES.filter((s) => !found.some((w) => w.file === STORES[s].writer && (w.stores ?? []).includes(s)));
    expect(unwritten).toEqual([]);
  });

  it('the service worker writes no store itself (it sends the outbox through the page\'s own push loop)', { timeout: 180_000 }, () => {
    // sw/background-push.ts runs web/sync/push.ts over web/db's outbox: one copy of the acknowledgement.
    expect(strayWrites(storeWrites(WORKER, ALL))).toEqual([]);
  });

  it('only the readings writer opens a readwrite transaction on readings', { timeout: 180_000 }, () => {
    const found = storeWrites(APP, ALL).filter((w) => w.stores === undefined || w.stores.includes('readings'));
    const opened = found.filter((w) => w.method === 'transaction' || (w.stores === undefined && w.method !== 'transaction'));
    expect(opened.filter((w) => w.file !== READINGS_WRITER).map(where)).toEqual([]);
    // The writer itself opens them (withReadingsWrite, saveReading, delete/restore, importReadings).
    expect(opened.filter((w) => w.method === 'transaction' && w.file === READINGS_WRITER).length).toBe(4);
  });
});
