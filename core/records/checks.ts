// Field checks shared by the record validators. Each throws a RecordValidationError naming the field.
import { textProblem, textProblemWords, TEXT_RULE_WORDS } from './text';
import { RecordValidationError } from './validation-error';

/** Latest time a record may carry, UTC ms: the ECMAScript Date limit (year 275760). */
export const MAX_TIME_MS = 8.64e15;
/** Longest free text kept in a note or observer field, characters. */
export const MAX_TEXT_LENGTH = 10_000;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

/** Checks that x is a plain object (not null, not a list) and returns it as a field map. */
export function requireObject(kind: string, field: string, x: unknown): Record<string, unknown> {
  if (typeof x !== 'object' || x === null || Array.isArray(x)) throw new RecordValidationError(kind, field, 'an object', x);
  return x as Record<string, unknown>;
}

/** Checks a text field: a string of at most `max` characters (at least 1 when `nonEmpty`) under the text rule (text.ts). */
export function requireText(kind: string, field: string, x: unknown, nonEmpty = false, max = MAX_TEXT_LENGTH): string {
  if (typeof x !== 'string' || x.length > max || (nonEmpty && x.trim().length === 0)) {
    throw new RecordValidationError(kind, field, `${nonEmpty ? 'a non-empty' : 'a'} text of at most ${max} characters`, x);
  }
  const problem = textProblem(x);
  if (problem) throw new RecordValidationError(kind, field, `${TEXT_RULE_WORDS}; it holds ${textProblemWords(problem)}`, x);
  return x;
}

/** Checks a finite number within [min, max]; `unit` is named in the message. */
export function requireNumber(kind: string, field: string, x: unknown, unit: string, min = -Infinity, max = Infinity): number {
  if (typeof x !== 'number' || !Number.isFinite(x) || x < min || x > max) {
    const range = min === -Infinity && max === Infinity ? '' : min === -Infinity ? ` ≤ ${max}` : max === Infinity ? ` ≥ ${min}` : ` from ${min} to ${max}`;
    throw new RecordValidationError(kind, field, `a finite number${range}${unit ? ` (${unit})` : ''}`, x);
  }
  return x;
}

/** Checks a time: an integer UTC epoch millisecond count from 0 to MAX_TIME_MS. */
export function requireTime(kind: string, field: string, x: unknown): number {
  if (typeof x !== 'number' || !Number.isInteger(x) || x < 0 || x > MAX_TIME_MS) {
    throw new RecordValidationError(kind, field, 'a whole number of UTC epoch milliseconds from 0 to 8.64e15', x);
  }
  return x;
}

/** Checks that x is one of the allowed strings. */
export function requireOneOf<T extends string>(kind: string, field: string, x: unknown, allowed: readonly T[]): T {
  if (typeof x !== 'string' || !(allowed as readonly string[]).includes(x)) {
    throw new RecordValidationError(kind, field, `one of ${allowed.map((a) => `'${a}'`).join(', ')}`, x);
  }
  return x as T;
}

/** Checks a list of texts. */
export function requireTextList(kind: string, field: string, x: unknown): string[] {
  if (!Array.isArray(x)) throw new RecordValidationError(kind, field, 'a list of texts', x);
  for (let i = 0; i < x.length; i++) requireText(kind, `${field}[${i}]`, x[i]);
  return x as string[];
}

/** True when x is a lower-case UUID string such as crypto.randomUUID() gives. */
export function isUuid(x: unknown): x is string {
  return typeof x === 'string' && UUID.test(x);
}

/** Checks a lower-case UUID string such as crypto.randomUUID() gives. */
export function requireUuid(kind: string, field: string, x: unknown): string {
  if (typeof x !== 'string' || !UUID.test(x)) throw new RecordValidationError(kind, field, 'a lower-case UUID', x);
  return x;
}

/** Checks a reference to another record: a non-empty id string of at most 100 characters. */
export function requireRef(kind: string, field: string, x: unknown): string {
  return requireText(kind, field, x, true, 100);
}

/** Checks a latitude/longitude pair in decimal degrees. */
export function requireLatLon(kind: string, field: string, x: unknown): void {
  const o = requireObject(kind, field, x);
  requireNumber(kind, `${field}.lat`, o.lat, 'degrees', -90, 90);
  requireNumber(kind, `${field}.lon`, o.lon, 'degrees', -180, 180);
}

/** Checks a JSON value: plain objects, lists, strings, finite numbers, booleans and null only. */
export function requireJson(kind: string, field: string, x: unknown, depth = 0): void {
  if (depth > 20) throw new RecordValidationError(kind, field, 'JSON nested at most 20 levels deep', x);
  if (x === null || typeof x === 'string' || typeof x === 'boolean') return;
  if (typeof x === 'number') {
    requireNumber(kind, field, x, '');
    return;
  }
  if (Array.isArray(x)) {
    for (let i = 0; i < x.length; i++) requireJson(kind, `${field}[${i}]`, x[i], depth + 1);
    return;
  }
  if (typeof x === 'object' && Object.getPrototypeOf(x) === Object.prototype) {
    for (const [k, v] of Object.entries(x)) requireJson(kind, `${field}.${k}`, v, depth + 1);
    return;
  }
  throw new RecordValidationError(kind, field, 'JSON data (object, list, text, number, true/false or null)', x);
}
