// Reading sources as one-byte codes, for the compact series kept beside the readings (web/db series store).
import type { ReadingSource } from './types';

/**
 * The code of each reading source in a series' `source` Uint8Array. The codes are stored on the phone:
 * never renumber one; a new source takes the next free code.
 */
export const READING_SOURCE_CODES = {
  staff: 0,
  'wire-weight': 1,
  'crest-stage': 2,
  logger: 3,
} as const satisfies Record<ReadingSource, number>;

/** A reading source code (0–3) as stored in a series. */
export type ReadingSourceCode = (typeof READING_SOURCE_CODES)[ReadingSource];

const BY_CODE: readonly ReadingSource[] = (Object.keys(READING_SOURCE_CODES) as ReadingSource[]).sort(
  (a, b) => READING_SOURCE_CODES[a] - READING_SOURCE_CODES[b],
);

/** The reading source of a series code; throws a RangeError for a code that names none. */
export function readingSourceOfCode(code: number): ReadingSource {
  const source = BY_CODE[code];
  if (source === undefined) throw new RangeError(`readingSourceOfCode needs a code from 0 to ${BY_CODE.length - 1}; got ${code}`);
  return source;
}
