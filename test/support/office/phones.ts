// Invented phones and their bundles for the receiver's tests and benchmark: an invented site (Tarn Brook at
// Mossgiel) and staff readings every 15 minutes, with revisions made by core's clock.
import { randomUUID } from 'node:crypto';
import { makeBundle, nextRev, type Bundle, type SyncRecord } from '../../../core/index';

/** 2026-06-01T00:00:00Z, UTC ms: the invented start of the readings. */
export const T0_MS = Date.UTC(2026, 5, 1);
const QUARTER_HOUR_MS = 15 * 60 * 1000;

/** The invented site every phone reads at. */
export const SITE_ID = '5f0c2a8e-1b7d-4c39-9e61-7a2d4b0c9f13';

/** The site record as a phone first sends it. */
export function siteRecord(deviceId: string): SyncRecord<'site'> {
  return {
    kind: 'site', id: SITE_ID, rev: nextRev(undefined, T0_MS, deviceId),
    body: {
      code: 'TB-02', name: 'Tarn Brook at Mossgiel', area_km2: 17.6, timeZone: 'Pacific/Auckland',
      displayUnits: 'metric', jumpLimit_m: 0.25, updated_ms: T0_MS,
    },
  };
}

/** `n` staff readings from one phone, the i-th at T0 + (offset + i)·15 min, each with its own revision. */
export function readingRecords(deviceId: string, n: number, offset = 0): SyncRecord<'reading'>[] {
  const out: SyncRecord<'reading'>[] = [];
  for (let i = 0; i < n; i++) {
    const time_ms = T0_MS + (offset + i) * QUARTER_HOUR_MS;
    out.push({
      kind: 'reading', id: randomUUID(), rev: nextRev(undefined, time_ms, deviceId),
      body: {
        siteId: SITE_ID, time_ms, stage_m: Number((0.42 + 0.001 * ((offset + i) % 300)).toFixed(3)),
        source: 'staff', quality: 'good', observer: 'H. Ferris', note: '', warnings: [], updated_ms: time_ms,
      },
    });
  }
  return out;
}

/** A bundle of `records` from device `deviceId`, with a new id. */
export function bundleOf(deviceId: string, records: SyncRecord[]): Bundle {
  return makeBundle({ id: randomUUID(), device: deviceId, created_ms: T0_MS + 86_400_000, records });
}

/** Pushes a bundle (or any JSON text) to `base`/bundles with a token; resolves to status and parsed body. */
export async function push(
  base: string,
  token: string | null,
  bundle: Bundle | string,
  headers: Record<string, string> = {},
): Promise<{ status: number; body: Record<string, unknown> }> {
  const text = typeof bundle === 'string' ? bundle : JSON.stringify(bundle);
  const h: Record<string, string> = { 'Content-Type': 'application/json', ...headers };
  if (token !== null) h.Authorization = `Bearer ${token}`;
  if (typeof bundle !== 'string' && !('Idempotency-Key' in headers)) h['Idempotency-Key'] = bundle.id;
  const res = await fetch(`${base}/bundles`, { method: 'POST', headers: h, body: text });
  return { status: res.status, body: (await res.json()) as Record<string, unknown> };
}

/** Pulls every page after `cursor` (following `more`) as phone `device` (its own bundles left out); resolves to the bundles and the last cursor. */
export async function pullAll(base: string, token: string, cursor = '0', device?: string): Promise<{ status: number; bundles: Bundle[]; cursor: string }> {
  const bundles: Bundle[] = [];
  const asking = device === undefined ? '' : `&device=${encodeURIComponent(device)}`;
  for (;;) {
    const res = await fetch(`${base}/bundles?after=${encodeURIComponent(cursor)}${asking}`, { headers: { Authorization: `Bearer ${token}` } });
    if (res.status !== 200) return { status: res.status, bundles, cursor };
    const body = (await res.json()) as { bundles: Bundle[]; cursor: string; more: boolean };
    bundles.push(...body.bundles);
    cursor = body.cursor;
    if (!body.more) return { status: 200, bundles, cursor };
  }
}
