// `freshet office …`: start the receiver, or manage the devices allowed to push (token, devices, revoke).
import { parseArgs } from 'node:util';
import { isIP } from 'node:net';
import { createReceiver, DEFAULT_MAX_BUNDLE_BYTES } from './http';
import { DEFAULT_MAX_PUSHES } from './admission';
import { createDevice, listDevices, revokeDevice } from './devices';
import { openOfficeDatabase, openServingDatabase, OfficeSetupError, type StoreLocation } from './open';
import { importBundle } from './import-files';
import { CliError } from '../shared/io';
import { readBundleFileParts } from '../shared/read-bundle';

/** Where `freshet office` writes: results to stdout, messages to stderr (the dispatcher's CliIo fits). */
export interface OfficeIo {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
}

function processOfficeIo(): OfficeIo {
  return { stdout: (t) => void process.stdout.write(t), stderr: (t) => void process.stderr.write(t) };
}

/** The help of `freshet office`. */
export const OFFICE_HELP = `freshet office: the office end of sync. Phones push bundles to it over HTTP; it keeps every record
version in PostgreSQL (embedded in a folder by default, or a server).

  freshet office --data <folder> [--port 8787] [--host 127.0.0.1] [--origin <app origin>]…
                 [--database <postgres URL>] [--behind-proxy] [--max-bundle-mb 16] [--max-pushes 64]
      Start the receiver. Pushes: POST /bundles; pulls: GET /bundles?after=<cursor>; photo bytes:
      PUT, HEAD, GET /blobs/sha256-<hex> (kept in the same database as the records).
      --max-pushes: pushes taken at once; more are told to come back later (503 with Retry-After).
      --origin may be given several times: the web addresses the app is served from (CORS).
      Listening anywhere but this machine (127.0.0.1, ::1, localhost) needs --behind-proxy:
      HTTPS is the reverse proxy's job.
  freshet office token <device name> (--data <folder> | --database <url>)
      Add a device and print its token once (only a hash is kept), with where to enter it on the
      phone and the address to type there (without /bundles).
  freshet office devices (--data <folder> | --database <url>)
      List devices, their last push and bundle count.
  freshet office revoke <device name> (--data <folder> | --database <url>)
      Refuse that device's token from now on.
  freshet office import <bundle.json>… (--data <folder> | --database <url>)
      Store bundle files brought from phones (no network) as if pushed, with the photos they carry;
      phones get them on their next pull.

With --data (the embedded database) the folder can be open in one process at a time: stop the receiver
to add a device, or use a PostgreSQL server (--database).`;

const OPTIONS = {
  data: { type: 'string' },
  database: { type: 'string' },
  port: { type: 'string' },
  host: { type: 'string' },
  origin: { type: 'string', multiple: true },
  'behind-proxy': { type: 'boolean' },
  'max-bundle-mb': { type: 'string' },
  'max-pushes': { type: 'string' },
  help: { type: 'boolean', short: 'h' },
} as const;

/** Runs `freshet office` with the arguments after "office"; resolves to the exit status (serving runs until a signal). */
export async function runOffice(args: readonly string[], io: OfficeIo = processOfficeIo()): Promise<number> {
  const out = { write: io.stdout };
  const err = { write: io.stderr };
  let parsed;
  try {
    parsed = parseArgs({ args: [...args], options: OPTIONS, allowPositionals: true, strict: true });
  } catch (e) {
    err.write(`freshet office: ${e instanceof Error ? e.message.split('\n')[0] : String(e)} (try freshet office --help)\n`);
    return 2;
  }
  const { values, positionals } = parsed;
  if (values.help) {
    out.write(OFFICE_HELP + '\n');
    return 0;
  }
  const where: StoreLocation = { data: values.data, database: values.database };
  const [command, ...rest] = positionals;
  try {
    switch (command) {
      case undefined:
        return await serve(values, where, out);
      case 'token':
      case 'revoke': {
        if (rest.length !== 1) {
          err.write(`freshet office ${command}: expected one device name; got ${rest.length} (try freshet office --help)\n`);
          return 2;
        }
        const db = await openOfficeDatabase(where, command === 'token' ? (line) => err.write(line + '\n') : undefined);
        try {
          if (command === 'token') {
            const token = await createDevice(db, rest[0]);
            err.write(`Token for ${JSON.stringify(rest[0])} (shown only now; the office keeps only a fingerprint of it):\n`);
            out.write(token + '\n');
            err.write(nextSteps(where));
            return 0;
          }
          if (!(await revokeDevice(db, rest[0]))) {
            err.write(`freshet office revoke: there is no device named ${JSON.stringify(rest[0])} (see freshet office devices)\n`);
            return 1;
          }
          out.write(`Revoked ${rest[0]}: its token is refused from now on.\n`);
          return 0;
        } finally {
          await db.close();
        }
      }
      case 'import': {
        if (rest.length === 0) {
          err.write('freshet office import: expected one or more bundle files (try freshet office --help)\n');
          return 2;
        }
        // Every file is read and checked before the database is opened: a bad file changes nothing.
        const bundles = [];
        for (const path of rest) bundles.push({ path, ...(await readBundleFileParts('office import', path, process.cwd())) });
        const db = await openOfficeDatabase(where);
        let refused = 0;
        try {
          for (const { path, bundle, blobs } of bundles) {
            const r = await importBundle(db, bundle, blobs);
            if (r.status === 'refused') {
              refused++;
              err.write(`${path}: refused, nothing of it stored: ${r.message}\n`);
            } else {
              const photos = blobs.size > 0 ? `, ${blobs.size} photo${blobs.size === 1 ? '' : 's'}` : '';
              out.write(`${path}: ${r.status === 'stored' ? 'stored' : 'already had it'} (${r.records} records${photos})\n`);
            }
          }
        } finally {
          await db.close();
        }
        return refused > 0 ? 1 : 0;
      }
      case 'devices': {
        const db = await openOfficeDatabase(where);
        try {
          const rows = await listDevices(db);
          if (rows.length === 0) out.write('No devices yet: add one with freshet office token <device name>.\n');
          for (const d of rows) {
            const state = d.revoked ? `revoked ${d.revoked}` : 'active';
            out.write(`${d.name}\t${state}\tlast push ${d.lastPush ?? 'never'}\t${d.bundles} bundles\n`);
          }
          return 0;
        } finally {
          await db.close();
        }
      }
      default:
        err.write(`freshet office: unknown command ${JSON.stringify(command)}; expected token, devices, revoke or import (try freshet office --help)\n`);
        return 2;
    }
  } catch (e) {
    if (e instanceof CliError) {
      err.write(`${e.message}\n`);
      return e.exitCode;
    }
    if (e instanceof OfficeSetupError || e instanceof RangeError) {
      err.write(`freshet office: ${e.message}\n`);
      return 1;
    }
    throw e;
  }
}

/** What to do with a new token: where it goes on the phone and the address to type there. */
export function nextSteps(where: StoreLocation): string {
  const folder = String(where.data);
  const store = where.database !== undefined ? '--database <the same URL>' : `--data ${/^[\w./:@-]+$/.test(folder) ? folder : JSON.stringify(folder)}`;
  return `Next steps:
  1. On the phone, open Sync. Under "Office endpoint", type the token above into "Token for this phone".
  2. Into "Office address" type the address the phone reaches this receiver at, WITHOUT /bundles at the end
     (the app adds /bundles itself): the HTTPS address of the proxy in front of the receiver, for example
     https://office.example.org/freshet (see the README, "HTTPS is the reverse proxy's job"), or
     http://127.0.0.1:8787 when the app runs in a browser on this same computer.
  3. Press "Save endpoint". The receiver must be running for the phone to sync:
     npx freshet office ${store} --origin <the web address the app is served from>
`;
}

/** True for addresses that only this machine can reach. */
export function isLoopback(host: string): boolean {
  if (host === 'localhost') return true;
  if (isIP(host) === 4) return host.startsWith('127.');
  return host === '::1';
}

async function serve(
  values: { port?: string; host?: string; origin?: string[]; 'behind-proxy'?: boolean; 'max-bundle-mb'?: string; 'max-pushes'?: string },
  where: StoreLocation,
  out: { write: (text: string) => void },
): Promise<number> {
  const port = Number(values.port ?? '8787');
  if (!Number.isInteger(port) || port < 1 || port > 65535) throw new OfficeSetupError(`--port needs a whole number from 1 to 65535; got ${values.port}`);
  const host = values.host ?? '127.0.0.1';
  if (!isLoopback(host) && !values['behind-proxy']) {
    throw new OfficeSetupError(
      `Refusing to listen on ${host} without --behind-proxy: tokens must travel over HTTPS, so put a reverse proxy with HTTPS in front and pass --behind-proxy (see the README).`,
    );
  }
  const origins = values.origin ?? [];
  for (const o of origins) {
    let ok = false;
    try {
      ok = new URL(o).origin === o;
    } catch {
      ok = false;
    }
    if (!ok) throw new OfficeSetupError(`--origin needs an origin like https://app.example.org (scheme, host, optional port, no path); got ${JSON.stringify(o)}`);
  }
  const mb = Number(values['max-bundle-mb'] ?? DEFAULT_MAX_BUNDLE_BYTES / 1024 / 1024);
  if (!Number.isFinite(mb) || mb <= 0 || mb > 1024) throw new OfficeSetupError(`--max-bundle-mb needs a size in MiB from above 0 to 1024; got ${values['max-bundle-mb']}`);
  const maxPushes = Number(values['max-pushes'] ?? DEFAULT_MAX_PUSHES);
  if (!Number.isInteger(maxPushes) || maxPushes < 1 || maxPushes > 10_000) {
    throw new OfficeSetupError(`--max-pushes needs a whole number of pushes from 1 to 10000; got ${values['max-pushes']}`);
  }
  const db = await openServingDatabase(where);
  const server = createReceiver({ db, origins, maxBundleBytes: Math.round(mb * 1024 * 1024), maxPushes });
  await new Promise<void>((resolveListen, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolveListen());
  }).catch(async (e: NodeJS.ErrnoException) => {
    await db.close();
    throw new OfficeSetupError(`Could not listen on ${host}:${port}: ${e.code === 'EADDRINUSE' ? 'the port is in use' : e.message}`);
  });
  const store = where.database !== undefined ? 'a PostgreSQL server' : `the embedded database in ${where.data}`;
  // The stop handlers are in place before the line that says where it listens: whoever reads that line
  // may stop the receiver at once (a supervisor, a test), and a signal must never find it unprepared.
  const exit = new Promise<number>((resolveExit) => {
    const stop = () => {
      server.close();
      server.closeAllConnections();
      db.close().then(() => resolveExit(0), () => resolveExit(1));
    };
    process.once('SIGINT', stop);
    process.once('SIGTERM', stop);
  });
  out.write(`Freshet office receiver on http://${host.includes(':') ? `[${host}]` : host}:${port}/bundles, records in ${store}; ` +
    `app origins: ${origins.length > 0 ? origins.join(', ') : 'none (only non-browser clients)'}\n`);
  return exit;
}
