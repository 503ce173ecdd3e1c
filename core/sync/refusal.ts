// Which records a refused push names (core/exchange/README.md, "Refused records"). A receiver that cannot
// store one record answers 400 (or 409/422) with JSON naming it: `index` (0-based in the bundle's records),
// `position` (1-based), or a message starting "Record <n> of the bundle" (what parseBundle says). 413 means
// the bundle was too large. Pure, so the page and the service worker read refusals the same way.
import { statedLimit_bytes } from '../exchange/bundle-size';
import type { PushAnswer } from './answer';

/** A refusal the outbox can act on by itself: one record named (or to be found), or a bundle too large. */
export type PushRefusal =
  | { kind: 'record'; /** 0-based index in the bundle's records, when the answer names one. */ index?: number; message: string }
  | { kind: 'too-large'; /** The receiver's stated limit, bytes, when it states one. */ limit_bytes?: number; message: string };

/** Reasons that concern the whole bundle or the request, never one record: these stay problems to fix. */
const WHOLE_BUNDLE = new Set(['json', 'shape', 'format', 'version', 'checksum', 'key', 'cursor', 'origin', 'method', 'path', 'size']);

function jsonBody(answer: PushAnswer): Record<string, unknown> | undefined {
  if (answer.contentType === null || !/^application\/([\w.+-]+\+)?json\b/i.test(answer.contentType.trim())) return undefined;
  try {
    const o = JSON.parse(answer.body) as unknown;
    return typeof o === 'object' && o !== null && !Array.isArray(o) ? (o as Record<string, unknown>) : undefined;
  } catch {
    return undefined;
  }
}

const whole = (x: unknown, from: number, to: number): number | undefined =>
  typeof x === 'number' && Number.isInteger(x) && x >= from && x <= to ? x : undefined;

/**
 * Reads the answer to a push of a bundle of `records` records as a refusal the outbox can act on, or
 * undefined (delivered, try later, or a problem the user must fix: token, address, a whole-bundle fault).
 * `limitHeader` is the receiver's Freshet-Max-Bundle-Bytes header, when it sent one.
 */
export function readRefusal(answer: PushAnswer, records: number, limitHeader: string | null = null): PushRefusal | undefined {
  const o = jsonBody(answer);
  const said = o && typeof o.message === 'string' && o.message.trim() ? o.message.trim().slice(0, 300) : undefined;
  if (answer.status === 413) {
    const limit_bytes = statedLimit_bytes(limitHeader);
    const message = said ?? 'The office refused the bundle as too large.';
    return limit_bytes === undefined ? { kind: 'too-large', message } : { kind: 'too-large', limit_bytes, message };
  }
  if (answer.status !== 400 && answer.status !== 409 && answer.status !== 422) return undefined;
  if (!o) return undefined;
  const reason = typeof o.error === 'string' ? o.error : typeof o.reason === 'string' ? o.reason : undefined;
  if (reason !== undefined && WHOLE_BUNDLE.has(reason)) return undefined;
  if (reason !== 'record' && answer.status === 400) return undefined;
  const message = said ?? `The office could not store a record (${answer.status}).`;
  const fromMessage = said ? /^Record (\d{1,7}) of the bundle\b/.exec(said) : null;
  const index =
    whole(o.index, 0, records - 1) ??
    whole(o.recordIndex, 0, records - 1) ??
    (whole(o.position, 1, records) !== undefined ? (o.position as number) - 1 : undefined) ??
    (fromMessage && Number(fromMessage[1]) >= 1 && Number(fromMessage[1]) <= records ? Number(fromMessage[1]) - 1 : undefined);
  return index === undefined ? { kind: 'record', message } : { kind: 'record', index, message };
}
