// Devices allowed to push: each has a name and a bearer token; the database keeps only the token's SHA-256.
import { createHash, randomBytes } from 'node:crypto';
import type { Queryable } from './db';

/** A registered device as listed: its name, when it was added, revoked and last pushed (ISO 8601 UTC or null). */
export interface DeviceRow {
  name: string;
  created: string;
  revoked: string | null;
  lastPush: string | null;
  lastBundleId: string | null;
  bundles: number;
}

/** The device a token belongs to. */
export interface AuthenticatedDevice {
  deviceNo: number;
  name: string;
}

/** Why a request's token was not accepted. */
export type TokenRefusal = 'missing' | 'unknown' | 'revoked';

/** SHA-256 of a token as lower-case hex: what the database keeps. */
export function tokenHash(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

// Letters of any script, digits, spaces and the marks names and descriptions use ("Hana's phone", "Site 3 (spare)").
const NAME = /^[\p{L}\p{N}][\p{L}\p{N} ._'’()-]{0,63}$/u;

/** Adds a device and returns its new token (256 random bits, base64url); refuses a taken or odd name. */
export async function createDevice(db: Queryable, name: string): Promise<string> {
  if (!NAME.test(name)) {
    throw new RangeError(
      `A device name needs 1–64 letters, digits, spaces or . _ - ' ( ), starting with a letter or digit; got ${JSON.stringify(name)}`,
    );
  }
  const taken = await db.query('select 1 from office_devices where name = $1', [name]);
  if (taken.length > 0) throw new RangeError(`There is already a device named ${JSON.stringify(name)}; choose another name`);
  const token = randomBytes(32).toString('base64url');
  await db.query('insert into office_devices (name, token_hash) values ($1, $2)', [name, tokenHash(token)]);
  return token;
}

/** Revokes a device's token so its pushes and pulls are refused; returns false when no such device. */
export async function revokeDevice(db: Queryable, name: string): Promise<boolean> {
  const rows = await db.query(
    'update office_devices set revoked_at = coalesce(revoked_at, now()) where name = $1 returning device_no',
    [name],
  );
  return rows.length > 0;
}

/** Every device, oldest first, with its last push and the number of bundles it pushed. */
export async function listDevices(db: Queryable): Promise<DeviceRow[]> {
  const rows = await db.query<{
    name: string; created: string; revoked: string | null; last_push: string | null; last_bundle: string | null; bundles: string;
  }>(`
    select d.name,
      to_char(d.created_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as created,
      to_char(d.revoked_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as revoked,
      to_char(d.last_push_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as last_push,
      d.last_bundle_id::text as last_bundle,
      (select count(*) from office_bundles b where b.device_no = d.device_no)::text as bundles
    from office_devices d order by d.device_no`);
  return rows.map((r) => ({
    name: r.name, created: r.created, revoked: r.revoked, lastPush: r.last_push, lastBundleId: r.last_bundle,
    bundles: Number(r.bundles),
  }));
}

/** The device for an Authorization header value ("Bearer <token>"), or why it was refused. */
export async function authenticate(
  db: Queryable,
  authorization: string | undefined,
): Promise<{ ok: true; device: AuthenticatedDevice } | { ok: false; reason: TokenRefusal }> {
  const m = /^Bearer\s+([A-Za-z0-9_-]{16,200})\s*$/.exec(authorization ?? '');
  if (!m) return { ok: false, reason: authorization ? 'unknown' : 'missing' };
  // Asked on every request: a named statement (prepared once per connection), its columns as text.
  const rows = await db.query<{ device_no: string; name: string; revoked: string }>(
    'select device_no::text as device_no, name, (revoked_at is not null)::text as revoked from office_devices where token_hash = $1',
    [tokenHash(m[1])],
    'freshet_authenticate',
  );
  if (rows.length === 0) return { ok: false, reason: 'unknown' };
  if (rows[0].revoked === 'true') return { ok: false, reason: 'revoked' };
  return { ok: true, device: { deviceNo: Number(rows[0].device_no), name: rows[0].name } };
}
