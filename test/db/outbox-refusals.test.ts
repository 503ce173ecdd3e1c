// The outbox on fake-indexeddb: bundles packed by bytes (oracle: the byte length of each bundle's own JSON,
// Buffer.byteLength, RFC 3629), rebuilt from the records when the limits change, versions set aside when
// the office refuses them (RFC 9110 §15.5.1 400 and §15.5.14 413), fixed, dropped or deleted, and the push
// loop against a fake office that checks bundles with core's parseBundle, as the receiver does.
import { afterEach, describe, expect, it } from 'vitest';
import { DEFAULT_BUNDLE_BYTES, parseBundle, type Bundle } from '../../core/index';
import {
  acknowledge, deleteReading, exportBundle, dropSetAside, getReading, getSyncValue, listSetAside, nextOutgoing, saveReading, saveSite, waitingCount,
} from '../../web/db/index';
import { getDb } from '../../web/db/connection';
import { noteStatedLimit, setAsideRefused } from '../../web/db/outbox-refusals';
import { importLoggerRecord } from '../../web/db/logger-days';
import { pushWaiting } from '../../web/sync/push';
import { reading, site, T0 } from '../support/records';
import { useFreshDb } from '../support/db';

const { clock } = useFreshDb();
const realFetch = globalThis.fetch;
afterEach(() => {
  globalThis.fetch = realFetch;
});
const bytes = (b: Bundle) => Buffer.byteLength(JSON.stringify(b), 'utf8');

async function siteWithReadings(n: number, note = (i: number) => `reading ${i}`) {
  const s = await saveSite(site());
  const readings = [];
  for (let i = 0; i < n; i++) {
    clock.now += 10;
    readings.push(await saveReading(reading(s.id, T0 + i * 900_000, 0.5 + i / 1000, { note: note(i) })));
  }
  return { s, readings };
}

/** Sends everything with acknowledge, as a receiver that takes every bundle; returns the bundles sent. */
async function drain(): Promise<Bundle[]> {
  const sent: Bundle[] = [];
  for (let e = await nextOutgoing(); e; e = await nextOutgoing()) {
    sent.push(e.bundle);
    await acknowledge(e.id);
  }
  return sent;
}

/** A fake office on globalThis.fetch: checks each bundle with parseBundle and answers as `decide` says. */
function fakeOffice(decide: (b: Bundle, body: string) => { status: number; json: unknown; headers?: Record<string, string> } | undefined) {
  const stored: Bundle[] = [];
  const answers: number[] = [];
  globalThis.fetch = (async (_url: string, init: RequestInit) => {
    const body = String(init.body);
    const b = parseBundle(JSON.parse(body));
    const d = decide(b, body) ?? { status: 201, json: { bundle: b.id, records: b.records.length, status: 'received' } };
    answers.push(d.status);
    if (d.status === 201) stored.push(b);
    return new Response(JSON.stringify(d.json), { status: d.status, headers: { 'Content-Type': 'application/json', ...d.headers } });
  }) as typeof fetch;
  return { stored, answers };
}
const SETTINGS = { base: 'https://office.invalid/freshet', token: 'token-for-tests' };

describe('bundles sized in bytes', () => {
  it('keeps every bundle within ¾ of the office’s stated limit, and delivers each record once', async () => {
    const { s, readings } = await siteWithReadings(40, (i) => `long note ${i} `.repeat(400));
    await noteStatedLimit(100_000);
    const sent = await drain();
    expect(sent.length).toBeGreaterThanOrEqual(3);
    for (const b of sent) expect(bytes(b)).toBeLessThanOrEqual(75_000);
    expect(sent.flatMap((b) => b.records.map((r) => r.id)).sort()).toEqual([s.id, ...readings.map((r) => r.id)].sort());
    expect(await waitingCount()).toBe(0);
  });

  it('rebuilds a kept bundle that no longer fits (a lower stated limit) instead of sending it forever', async () => {
    await siteWithReadings(30, (i) => `note ${i} `.repeat(300));
    const first = await nextOutgoing();
    expect(bytes(first!.bundle)).toBeGreaterThan(60_000);
    expect((await nextOutgoing())?.id).toBe(first!.id);
    await noteStatedLimit(80_000);
    const rebuilt = await nextOutgoing();
    expect(rebuilt!.id).not.toBe(first!.id);
    expect(bytes(rebuilt!.bundle)).toBeLessThanOrEqual(60_000);
    expect(await (await getDb()).count('outbox')).toBe(1);
  });

  it('sends logger days of one-second values (86,400 a day) in bundles under 4 MiB, none stuck', async () => {
    const s = await saveSite(site());
    const day0 = Math.floor(T0 / 86_400_000) * 86_400_000;
    const n = 3 * 86_400;
    const time_ms = Float64Array.from({ length: n }, (_, i) => day0 + i * 1000);
    // Invented stages with full double precision (the longest numbers JSON writes), as a drifting sensor gives.
    const raw_m = Float64Array.from({ length: n }, (_, i) => 0.5 + 0.3 * Math.sin(i / 997) + i * 1e-9);
    await importLoggerRecord({ siteId: s.id, fileName: 'kc01-1s.csv', time_ms, raw_m, correction_m: new Float64Array(n), checks: [] });
    const sent = await drain();
    const loggerDays = sent.flatMap((b) => b.records).filter((r) => r.kind === 'logger-day');
    expect(loggerDays).toHaveLength(3);
    for (const b of sent) expect(bytes(b)).toBeLessThanOrEqual(DEFAULT_BUNDLE_BYTES);
    // Together they are more than one bundle may hold (issue 19: ten such days made one 17 MiB bundle).
    expect(sent.reduce((t, b) => t + bytes(b), 0)).toBeGreaterThan(DEFAULT_BUNDLE_BYTES);
    expect(await waitingCount()).toBe(0);
  }, 60_000);
});

describe('set aside', () => {
  it('keeps a refused version out, sends the rest, and a fix sends the new version', async () => {
    const { readings } = await siteWithReadings(3);
    const first = await nextOutgoing();
    await setAsideRefused(first!.id, 2, 'The office could not store this record.');
    expect(await waitingCount()).toBe(3);
    const again = await nextOutgoing();
    expect(again!.id).not.toBe(first!.id);
    expect(again!.bundle.records.map((r) => r.id)).not.toContain(readings[1].id);
    await acknowledge(again!.id);
    expect(await waitingCount()).toBe(0);
    expect((await listSetAside()).map((v) => [v.id, v.state, v.by])).toEqual([[readings[1].id, 'open', 'office']]);
    // The fix: an edit makes a new version, which waits and goes; the set-aside one is replaced.
    clock.now += 1000;
    const fixed = await saveReading({ ...(await getReading(readings[1].id))!, note: 'checked again' });
    expect(await waitingCount()).toBe(1);
    expect((await listSetAside())[0].state).toBe('replaced');
    const last = await drain();
    expect(last.flatMap((b) => b.records.map((r) => r.rev))).toEqual([fixed.rev]);
  });

  it('records a drop as a choice with its time, and keeps the record on the phone', async () => {
    const { readings } = await siteWithReadings(2);
    const e = await nextOutgoing();
    await setAsideRefused(e!.id, 1, 'refused');
    const [v] = await listSetAside();
    clock.now += 5000;
    await dropSetAside(v.mark);
    expect((await listSetAside())[0]).toMatchObject({ state: 'dropped', dropped: { at_ms: clock.now, because: 'chosen' } });
    expect(await getReading(readings[0].id)).toBeDefined();
    await drain();
    expect(await waitingCount()).toBe(0);
  });

  it('sets aside a stored version that breaks the text rule before sending (U+0000, Unicode Cc), and its deletion too', async () => {
    const { readings } = await siteWithReadings(3);
    // A version written before the text rule existed: put as it is, bypassing today's checks.
    const db = await getDb();
    const old = (await getReading(readings[1].id))!;
    await db.put('readings', { ...old, note: 'logger export \u0000\u0000 junk' });
    // A bundle file of every record leaves it out (and says how many), so the file itself is never refused.
    const file = await exportBundle(false);
    expect(file.leftOut).toBe(1);
    expect(parseBundle(JSON.parse(JSON.stringify(file.bundle))).records).toHaveLength(3);
    const e = await nextOutgoing();
    expect(e!.bundle.records.map((r) => r.id)).not.toContain(readings[1].id);
    const [v] = await listSetAside();
    expect(v).toMatchObject({ id: readings[1].id, by: 'phone', state: 'open' });
    expect(v.reason).toBe('This version holds text that cannot be stored: a NUL character (U+0000) at character 15 in the note.');
    await acknowledge(e!.id);
    // Deleting it: the tombstone carries the same text, so it is dropped at once as a deletion; nothing is stuck.
    clock.now += 1000;
    await deleteReading(readings[1].id);
    expect(await nextOutgoing()).toBeUndefined();
    expect(await waitingCount()).toBe(0);
    expect((await listSetAside()).find((x) => x.deleted)).toMatchObject({ dropped: { because: 'deleted' } });
  });
});

describe('the push loop against a fake office', () => {
  it('finds a refused record the office does not name by halving, sets it aside, and delivers all the others', async () => {
    const { s, readings } = await siteWithReadings(13, (i) => (i === 9 ? 'the office refuses this one' : `reading ${i}`));
    const office = fakeOffice((b) => (b.records.some((r) => (r.body as { note?: string }).note === 'the office refuses this one') ? { status: 400, json: { error: 'record', message: 'A record could not be stored.' } } : undefined));
    const run = await pushWaiting(SETTINGS);
    expect(run.kind).toBe('sent');
    const delivered = office.stored.flatMap((b) => b.records.map((r) => r.id));
    expect(delivered.sort()).toEqual([s.id, ...readings.filter((_, i) => i !== 9).map((r) => r.id)].sort());
    // Bounded: 14 records are found in at most ⌈log2 14⌉ + 1 = 5 refusals.
    expect(office.answers.filter((a) => a === 400).length).toBeLessThanOrEqual(5);
    expect((await listSetAside()).map((v) => v.id)).toEqual([readings[9].id]);
    expect(await getSyncValue('outboxLimits')).toEqual({});
  });

  it('sets aside the record the office names by position, as the receiver’s bundle check words it', async () => {
    const { readings } = await siteWithReadings(4, (i) => (i === 2 ? 'refuse' : 'ok'));
    const office = fakeOffice((b) => {
      const i = b.records.findIndex((r) => (r.body as { note?: string }).note === 'refuse');
      return i < 0 ? undefined : { status: 400, json: { error: 'record', message: `Record ${i + 1} of the bundle is not valid: the office says no.` } };
    });
    expect((await pushWaiting(SETTINGS)).kind).toBe('sent');
    expect(office.answers).toEqual([400, 201]);
    expect(await listSetAside()).toMatchObject([{ id: readings[2].id, reason: 'Record 4 of the bundle is not valid: the office says no.', state: 'open' }]);
  });

  it('splits bundles the office refuses as too large (413 with its stated limit) until they pass', async () => {
    await siteWithReadings(20, (i) => `note ${i} `.repeat(500));
    const office = fakeOffice((_b, body) => (Buffer.byteLength(body) > 50_000 ? { status: 413, json: { error: 'size', message: 'too large' }, headers: { 'Freshet-Max-Bundle-Bytes': '50000' } } : undefined));
    expect((await pushWaiting(SETTINGS)).kind).toBe('sent');
    expect(office.stored.flatMap((b) => b.records)).toHaveLength(21);
    expect(office.answers.filter((a) => a === 413).length).toBe(1);
    expect(await getSyncValue('outboxLimits')).toMatchObject({ stated_bytes: 50_000 });
  });

  it('stops on a token refusal without setting anything aside (401 is for the user to fix)', async () => {
    await siteWithReadings(2);
    fakeOffice(() => ({ status: 401, json: { error: 'token-unknown', message: 'unknown token' } }));
    const run = await pushWaiting(SETTINGS);
    expect(run).toMatchObject({ kind: 'stopped', outcome: { kind: 'fix' } });
    expect(await listSetAside()).toEqual([]);
    expect(await waitingCount()).toBe(3);
  });
});
