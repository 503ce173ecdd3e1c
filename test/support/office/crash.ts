// The crash test, shared by both engines: a receiver process killed (SIGKILL) while it stores a bundle
// leaves nothing of that bundle, and the bundle is stored whole (201, not 200) when it is pushed again.
import { spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import type { Server } from 'node:http';
import { expect } from 'vitest';
import type { Database } from '../../../office/receiver/db';
import { createDevice } from '../../../office/receiver/devices';
import { createReceiver } from '../../../office/receiver/http';
import { bundleOf, push, readingRecords } from './phones';

const SCRIPT = fileURLToPath(new URL('./hold-before-commit.ts', import.meta.url));

/** Runs the crash scenario: the child uses `args` (--data dir | --database url); `open` reopens the same store. */
export async function killWhileStoring(args: [string, string], port: number, open: () => Promise<Database>): Promise<void> {
  const child = spawn(process.execPath, ['--import', 'tsx', SCRIPT, ...args, String(port)], { stdio: ['ignore', 'pipe', 'inherit'] });
  let out = '';
  const exited = new Promise<NodeJS.Signals | null>((r) => child.on('exit', (_code, signal) => r(signal)));
  const waitFor = (re: RegExp) => new Promise<RegExpMatchArray>((resolve, reject) => {
    const check = () => {
      const m = re.exec(out);
      if (m) resolve(m);
    };
    child.stdout.on('data', (d: Buffer) => {
      out += d.toString();
      check();
    });
    exited.then(() => reject(new Error(`the receiver process ended early; its output: ${out}`)));
    check();
  });
  try {
    const [, token] = await waitFor(/^ready (\S+)$/m);
    const bundle = bundleOf('dev-a', readingRecords('dev-a', 100));
    const base = `http://127.0.0.1:${port}`;
    const answer = push(base, token, bundle).then((r) => r.status, (e: unknown) => e);
    const [, inside] = await waitFor(/^holding (\d+)$/m);
    // Inside its transaction the receiver had written all 100 versions when it was killed.
    expect(Number(inside)).toBe(100);
    child.kill('SIGKILL');
    expect(await exited).toBe('SIGKILL');
    expect(await answer).toBeInstanceOf(Error);

    const db = await open();
    let server: Server | undefined;
    try {
      for (const table of ['record_versions', 'current_records', 'office_bundles']) {
        const [r] = await db.query<{ n: string }>(`select count(*)::text as n from ${table}`);
        expect({ table, n: Number(r.n) }).toEqual({ table, n: 0 });
      }
      const again = await createDevice(db, 'phone A again');
      server = createReceiver({ db, origins: [], log: () => {} });
      await new Promise<void>((r) => server?.listen(port, '127.0.0.1', r));
      const retry = await push(base, again, bundle);
      expect(retry.status).toBe(201);
      const [r] = await db.query<{ n: string }>('select count(*)::text as n from record_versions');
      expect(Number(r.n)).toBe(100);
    } finally {
      if (server) {
        server.closeAllConnections();
        await new Promise((r) => server?.close(r));
      }
      await db.close();
    }
  } finally {
    if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  }
}
