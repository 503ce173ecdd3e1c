// The error a record that fails validation is refused with: a RangeError naming the field.

/** A record refused by validation: `field` is the path of the offending field (e.g. "gps.accuracy_m"). */
export class RecordValidationError extends RangeError {
  /** Path of the field that failed, e.g. "stage_m" or "segments[1].exponent". */
  readonly field: string;
  /** The record kind being checked, e.g. "reading". */
  readonly kind: string;

  /** What the field needs, in words. */
  readonly expected: string;
  /** The offending value, described in words. */
  readonly got: string;

  constructor(kind: string, field: string, expected: string, got: unknown) {
    const gotText = describeValue(got);
    super(`${kind} ${field} must be ${expected}; got ${gotText}`);
    this.name = 'RecordValidationError';
    this.kind = kind;
    this.field = field;
    this.expected = expected;
    this.got = gotText;
  }

  /** The same refusal with the field path prefixed, e.g. "readings[12]." for one item of a list. */
  within(prefix: string): RecordValidationError {
    const e = new RecordValidationError(this.kind, prefix + this.field, this.expected, undefined);
    e.message = `${this.kind} ${prefix}${this.field} must be ${this.expected}; got ${this.got}`;
    (e as { got: string }).got = this.got;
    return e;
  }
}

/** A short, readable description of any value for an error message. */
export function describeValue(x: unknown): string {
  if (x === undefined) return 'nothing';
  if (x === null) return 'null';
  if (typeof x === 'string') return x.length > 40 ? `a ${x.length}-character text` : JSON.stringify(x);
  if (typeof x === 'number' || typeof x === 'boolean') return String(x);
  if (Array.isArray(x)) return `a list of ${x.length}`;
  return typeof x === 'object' ? 'an object' : typeof x;
}
