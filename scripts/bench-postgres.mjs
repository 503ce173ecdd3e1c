// A PostgreSQL server for `npm run bench`: the one FRESHET_TEST_POSTGRES_URL names, or else a throwaway
// cluster in a temp folder when PostgreSQL is installed under /usr/lib/postgresql (as .ci/run starts for the
// tests): run by an unprivileged user when we are root (PostgreSQL refuses root), listening on 127.0.0.1
// only, trust authentication (acceptable for a cluster that lives for one run on loopback), stopped and
// removed at the end. Without either, says why the server figures are skipped.
import { spawnSync } from 'node:child_process';
import { chownSync, existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** Ports tried for the throwaway cluster, in order (the tests' shared server uses 4600). */
const PORTS = [4611, 4612, 4613, 4614, 4615];

function newestBin() {
  const root = '/usr/lib/postgresql';
  if (!existsSync(root)) return null;
  const versions = readdirSync(root).filter((v) => existsSync(join(root, v, 'bin', 'initdb'))).sort((a, b) => Number(b) - Number(a));
  return versions.length > 0 ? join(root, versions[0], 'bin') : null;
}

function unprivilegedUser() {
  for (const name of ['postgres', 'nobody']) {
    const r = spawnSync('id', ['-u', name], { encoding: 'utf8' });
    if (r.status === 0) return { name, uid: Number(r.stdout.trim()) };
  }
  return null;
}

/** Returns { url, note, stop } for a server to use, or { skipped, stop } with the reason there is none. */
export function startBenchPostgres() {
  const given = process.env.FRESHET_TEST_POSTGRES_URL;
  if (given) return { url: given, note: `the server given in FRESHET_TEST_POSTGRES_URL (${new URL(given).host})`, stop: () => {} };
  const bin = newestBin();
  if (!bin) return { skipped: 'no server given in FRESHET_TEST_POSTGRES_URL and PostgreSQL is not installed under /usr/lib/postgresql', stop: () => {} };
  const dir = mkdtempSync(join(tmpdir(), 'freshet-bench-pg-'));
  let sh = (cmd) => spawnSync('sh', ['-c', cmd], { encoding: 'utf8', cwd: tmpdir() });
  if (process.getuid?.() === 0) {
    const user = unprivilegedUser();
    if (!user) {
      rmSync(dir, { recursive: true, force: true });
      return { skipped: 'running as root and no unprivileged user (postgres or nobody) to run a PostgreSQL cluster', stop: () => {} };
    }
    chownSync(dir, user.uid, -1);
    sh = (cmd) => spawnSync('su', [user.name, '-s', '/bin/sh', '-c', cmd], { encoding: 'utf8', cwd: tmpdir() });
  }
  const remove = () => rmSync(dir, { recursive: true, force: true });
  const init = sh(`${bin}/initdb -D ${dir}/data -U freshet --auth-local=trust --auth-host=trust -E UTF8 >${dir}/initdb.log 2>&1`);
  if (init.status !== 0) {
    remove();
    return { skipped: `initdb failed (status ${init.status}); no throwaway cluster`, stop: () => {} };
  }
  for (const port of PORTS) {
    const start = sh(`${bin}/pg_ctl -D ${dir}/data -l ${dir}/server.log -w -o '-p ${port} -k ${dir} -c listen_addresses=127.0.0.1' start >/dev/null 2>&1`);
    if (start.status !== 0) continue;
    let stopped = false;
    const stop = () => {
      if (stopped) return;
      stopped = true;
      sh(`${bin}/pg_ctl -D ${dir}/data -m immediate stop >/dev/null 2>&1`);
      remove();
    };
    process.once('exit', stop);
    return { url: `postgres://freshet@127.0.0.1:${port}/postgres`, note: `a throwaway cluster started for this run (${bin}, port ${port})`, stop };
  }
  remove();
  return { skipped: `a throwaway cluster could not start on any of ports ${PORTS.join(', ')}`, stop: () => {} };
}
