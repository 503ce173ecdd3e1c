// The reopening rule of keep-open.ts on stand-in databases (no engine, no port): a lost database is
// closed and opened again after waits that grow; a round gives up after its tries and the next request
// starts another; a database that answered with an error of its own (not lost) is kept; close stops it all.
import { describe, expect, it } from 'vitest';
import type { Database } from '../../office/receiver/db';
import { DatabaseDown, keepOpen } from '../../office/receiver/keep-open';

function standIn(name: string): Database & { kill(): void; closed: number } {
  let alive = true;
  const self = {
    engine: 'pglite' as const,
    closed: 0,
    kill: () => void (alive = false),
    lost: () => !alive,
    async query<T>(sql: string): Promise<T[]> {
      if (!alive) throw new Error('engine gone');
      if (sql === 'bad') throw Object.assign(new Error('syntax'), { code: '42601' });
      return [{ name } as T];
    },
    async transaction<T>(fn: (tx: Database) => Promise<T>): Promise<T> {
      return fn(self as unknown as Database);
    },
    async exec() {},
    async close() {
      self.closed++;
      alive = false;
    },
  };
  return self;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('keepOpen', () => {
  it('keeps a database that refused a statement of its own, and reopens a lost one', async () => {
    const first = standIn('first');
    let opens = 0;
    const db = keepOpen(first, async () => standIn(`again ${++opens}`), { log: () => {}, firstWait_ms: 5 });
    await expect(db.query('bad')).rejects.toMatchObject({ code: '42601' });
    expect(await db.query('select')).toEqual([{ name: 'first' }]);
    first.kill();
    const err = await db.query('select').catch((e: unknown) => e);
    expect(err).toBeInstanceOf(DatabaseDown);
    expect((err as DatabaseDown).retryAfter_s).toBeGreaterThanOrEqual(1);
    expect(first.closed).toBe(1);
    while (opens === 0) await sleep(5);
    await sleep(5);
    expect(await db.query('select')).toEqual([{ name: 'again 1' }]);
    await db.close();
  });

  it('gives up a round after its tries, with waits that double, and tries again on the next request', async () => {
    const first = standIn('first');
    const tries: number[] = [];
    let refuse = true;
    const logs: string[] = [];
    const db = keepOpen(first, async () => {
      tries.push(Date.now());
      if (refuse) throw new Error('folder in use');
      return standIn('back');
    }, { log: (l) => logs.push(l), attempts: 3, firstWait_ms: 20, maxWait_ms: 1000 });
    first.kill();
    await expect(db.query('select')).rejects.toBeInstanceOf(DatabaseDown);
    while (!logs.some((l) => /could not be opened again after 3 tries/.test(l))) await sleep(5);
    expect(tries.length).toBe(3);
    // Waits of 20, 40, 80 ms: each gap at least the wait before it (timers never fire early).
    expect(tries[2] - tries[1]).toBeGreaterThanOrEqual(79);
    await sleep(200);
    expect(tries.length).toBe(3);
    refuse = false;
    await expect(db.query('select')).rejects.toBeInstanceOf(DatabaseDown);
    while (tries.length < 4) await sleep(5);
    await sleep(5);
    expect(await db.query('select')).toEqual([{ name: 'back' }]);
    await db.close();
  });

  it('stops reopening when closed', async () => {
    const first = standIn('first');
    let opens = 0;
    const db = keepOpen(first, async () => standIn(`again ${++opens}`), { log: () => {}, firstWait_ms: 50 });
    first.kill();
    await expect(db.query('select')).rejects.toBeInstanceOf(DatabaseDown);
    await db.close();
    await sleep(100);
    expect(opens).toBe(0);
  });
});
