// A throwaway PostgreSQL cluster of a test's own (so the test may stop and restart it): initdb into a temp
// folder and pg_ctl, run as an unprivileged user as .ci/run does (PostgreSQL refuses to run as root),
// listening on 127.0.0.1 only with trust authentication (it lives for one test on loopback).
import { execFileSync } from 'node:child_process';
import { chownSync, existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir, userInfo } from 'node:os';
import { join } from 'node:path';

/** Where .ci/run installs the server binaries (Debian's postgresql-15). */
export const PG_BIN = '/usr/lib/postgresql/15/bin';

/** Why an own cluster cannot be started here, or undefined when it can. */
export function ownClusterMissing(): string | undefined {
  if (!existsSync(join(PG_BIN, 'initdb')) || !existsSync(join(PG_BIN, 'pg_ctl'))) return `no PostgreSQL binaries in ${PG_BIN} (.ci/run installs them)`;
  if (userInfo().uid === 0) {
    try {
      execFileSync('id', ['postgres'], { stdio: 'ignore' });
    } catch {
      return 'running as root and there is no "postgres" user to run the server as';
    }
  }
  return undefined;
}

/** A running cluster: its URL, and stop (like a crash), start and remove. */
export interface OwnCluster {
  url: string;
  /** pg_ctl -m immediate stop: every connection is cut, as in a crash or a hard restart. */
  stopImmediately(): void;
  start(): void;
  remove(): void;
}

/** Creates and starts a cluster listening on 127.0.0.1:`port`. */
export function startOwnCluster(port: number): OwnCluster {
  const dir = mkdtempSync(join(tmpdir(), 'freshet-own-pg-'));
  const root = userInfo().uid === 0;
  if (root) execFileSync('chown', ['postgres', dir]);
  else chownSync(dir, userInfo().uid, userInfo().gid);
  const run = (cmd: string) => {
    if (root) execFileSync('su', ['postgres', '-s', '/bin/sh', '-c', `cd /tmp && ${cmd}`], { stdio: 'ignore' });
    else execFileSync('/bin/sh', ['-c', `cd /tmp && ${cmd}`], { stdio: 'ignore' });
  };
  const data = join(dir, 'data');
  run(`${PG_BIN}/initdb -D ${data} -U freshet --auth-local=trust --auth-host=trust -E UTF8 >${dir}/initdb.log 2>&1`);
  const start = () =>
    run(`${PG_BIN}/pg_ctl -D ${data} -l ${dir}/server.log -w -o '-p ${port} -k ${dir} -c listen_addresses=127.0.0.1 -c max_connections=40 -c shared_buffers=16MB -c fsync=off' start`);
  start();
  return {
    url: `postgres://freshet@127.0.0.1:${port}/postgres`,
    stopImmediately: () => run(`${PG_BIN}/pg_ctl -D ${data} -m immediate -w stop`),
    start,
    remove: () => {
      try {
        run(`${PG_BIN}/pg_ctl -D ${data} -m immediate -w stop`);
      } catch {
        // Already stopped.
      }
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
