// Small rules of the photo screens and delivery, in Node: the low-room warning (a tenth of the quota,
// common practice for a margin, from memory), pinch zoom arithmetic (exact: the scale is the ratio of
// finger distances, clamped), when a chosen file's own time is believed, and how an upload answer reads
// (RFC 9110 §15: 201/200 with the same hash held, 400 "hash" damaged, 413/415 refused, 503 later).
import { describe, expect, it } from 'vitest';
import { roomWarning } from '../../web/components/Photos/room';
import { takenTime } from '../../web/components/Photos/keep';
import { FITTED, MAX_SCALE, panned, pinched, stepped, transformOf } from '../../web/components/Photos/zoom';
import { readBlobAnswer } from '../../web/sync/photo-answer';

const SHA = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad';
const answer = (status: number, body: unknown = '', retryAfter: string | null = null) => ({
  status, contentType: 'application/json', body: typeof body === 'string' ? body : JSON.stringify(body), retryAfter,
});

describe('room for photos', () => {
  it('warns when one more photo would leave less than a tenth of the quota', () => {
    expect(roomWarning(0, 10_000_000_000)).toBeUndefined();
    expect(roomWarning(8_900_000_000, 10_000_000_000, 1_000_000)).toBeUndefined(); // 1.099 GB left ≥ 1 GB
    expect(roomWarning(8_999_500_000, 10_000_000_000, 1_000_000)).toMatch(/^Little room is left for Freshet on this phone \(about 954 MB\)\./);
    expect(roomWarning(950, 1000, 0)).toMatch(/about 0\.0 MB/); // 50 bytes left of 1,000: under a tenth
  });
  it('says nothing when the browser gives no estimate', () => {
    expect(roomWarning(undefined, undefined)).toBeUndefined();
    expect(roomWarning(10, 0)).toBeUndefined();
  });
});

describe('pinch zoom', () => {
  it('scales by the ratio of the finger distances and follows their midpoint', () => {
    const v = pinched(FITTED, { x: 100, y: 100 }, { x: 200, y: 100 }, { x: 50, y: 110 }, { x: 250, y: 110 });
    expect(v).toEqual({ scale: 2, x: 0, y: 10 });
    expect(transformOf(v)).toBe('translate(0px, 10px) scale(2)');
  });
  it('stays between fitted and eight times, and a fitted picture does not pan', () => {
    expect(pinched(FITTED, { x: 0, y: 0 }, { x: 10, y: 0 }, { x: 0, y: 0 }, { x: 1000, y: 0 }).scale).toBe(MAX_SCALE);
    expect(pinched({ scale: 2, x: 30, y: 0 }, { x: 0, y: 0 }, { x: 100, y: 0 }, { x: 0, y: 0 }, { x: 10, y: 0 })).toEqual(FITTED);
    expect(panned(FITTED, 40, 40)).toEqual(FITTED);
    expect(panned({ scale: 2, x: 0, y: 0 }, 40, -10)).toEqual({ scale: 2, x: 40, y: -10 });
    expect(stepped({ scale: 2, x: 10, y: 4 }, 1.5)).toEqual({ scale: 3, x: 15, y: 6 });
    expect(stepped({ scale: 1.2, x: 10, y: 4 }, 0.5)).toEqual(FITTED);
  });
});

describe('when a photo was taken', () => {
  const now = Date.UTC(2026, 2, 1, 9);
  it("believes the file's own time unless it is in the future or before 1990", () => {
    expect(takenTime({ lastModified: now - 3_600_000 }, now)).toBe(now - 3_600_000);
    expect(takenTime({ lastModified: now + 86_400_000 }, now)).toBe(now);
    expect(takenTime({ lastModified: 0 }, now)).toBe(now);
    expect(takenTime({}, now)).toBe(now);
  });
});

describe('the answer to a photo upload', () => {
  it('counts the photo delivered only on 201/200 naming the same hash', () => {
    expect(readBlobAnswer(answer(201, { sha256: SHA, bytes: 3, stored: 'new' }), SHA)).toEqual({ kind: 'held' });
    expect(readBlobAnswer(answer(200, { sha256: SHA, bytes: 3, stored: 'held' }), SHA)).toEqual({ kind: 'held' });
    expect(readBlobAnswer(answer(200, { sha256: SHA.replace('b', 'c') }), SHA).kind).toBe('retry');
    expect(readBlobAnswer(answer(200, '<html>Wi-Fi login</html>'), SHA).kind).toBe('retry');
  });
  it('reads damage, refusals and failures', () => {
    expect(readBlobAnswer(answer(400, { reason: 'hash', message: 'damaged' }), SHA)).toEqual({ kind: 'damaged' });
    expect(readBlobAnswer(answer(413, { reason: 'size' }), SHA)).toEqual({ kind: 'refused', message: 'The office refused this photo as larger than it takes. It stays on this phone.' });
    expect(readBlobAnswer(answer(415, { reason: 'type' }), SHA).kind).toBe('refused');
    expect(readBlobAnswer(answer(503, { reason: 'database' }, '30'), SHA)).toMatchObject({ kind: 'retry', after_ms: 30_000 });
    expect(readBlobAnswer(answer(401, { reason: 'token' }), SHA).kind).toBe('fix');
    expect(readBlobAnswer(answer(0), SHA).kind).toBe('retry');
  });
});
