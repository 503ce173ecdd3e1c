// A receiver as its own process (`freshet office`, the command an office runs), for tests that measure it
// from outside or kill it: its process id, its address, and ways to stop it.
import { spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const FRESHET = fileURLToPath(new URL('../../../bin/freshet.mjs', import.meta.url));

/** A running receiver process. */
export interface ReceiverChild {
  pid: number;
  base: string;
  /** Resolves with the signal (or null) when the process has ended. */
  exited: Promise<NodeJS.Signals | null>;
  /** Kills it at once (SIGKILL): no shutdown, no answers to pushes in flight. */
  kill(): Promise<void>;
  /** Stops it as an operator would (SIGTERM) and waits for it to end. */
  stop(): Promise<void>;
}

/** Starts `freshet office <where…> --port <port> <extra…>` on 127.0.0.1 and waits until it listens. */
export async function startReceiverChild(where: string[], port: number, extra: string[] = []): Promise<ReceiverChild> {
  const child: ChildProcess = spawn(process.execPath, [FRESHET, 'office', ...where, '--port', String(port), ...extra], {
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const exited = new Promise<NodeJS.Signals | null>((r) => child.on('exit', (_code, signal) => r(signal)));
  let out = '';
  let err = '';
  child.stderr?.on('data', (d: Buffer) => (err += d.toString()));
  await new Promise<void>((resolve, reject) => {
    child.stdout?.on('data', (d: Buffer) => {
      // Request log lines follow; only the start line is kept.
      if (out.includes('\n')) return;
      out += d.toString();
      if (/Freshet office receiver on /.test(out)) resolve();
    });
    void exited.then(() => reject(new Error(`the receiver process ended before listening: ${out}${err}`)));
  });
  const end = async (signal: NodeJS.Signals) => {
    if (child.exitCode === null && child.signalCode === null) child.kill(signal);
    await exited;
  };
  return {
    pid: child.pid as number,
    base: `http://127.0.0.1:${port}`,
    exited,
    kill: () => end('SIGKILL'),
    stop: () => end('SIGTERM'),
  };
}

/** Resident memory of a process now, bytes (Linux /proc; VmRSS). */
export function residentBytes(pid: number): number {
  const m = /^VmRSS:\s+(\d+) kB$/m.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  if (!m) throw new Error(`no VmRSS for process ${pid}`);
  return Number(m[1]) * 1024;
}
