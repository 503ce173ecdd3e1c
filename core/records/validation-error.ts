// The error a record that fails validation is refused with: a RangeError naming the field.

/** A record refused by validation: `field` is the path of the offending field (e.g. "gps.accuracy_m"). */
export class RecordValidationError extends RangeError {
  /** Path of the field that failed, e.g. "stage_m" or "segments[1].exponent". */
  readonly field: string;
  /** The record kind being checked, e.g. "reading". */
  readonly kind: string;

  constructor(kind: string, field: string, expected: string, got: unknown) {
    super(`${kind} ${field} must be ${expected}; got ${describeValue(got)}`);
    this.name = 'RecordValidationError';
    this.kind = kind;
    this.field = field;
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
