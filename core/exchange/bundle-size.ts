// Bundles sized in bytes (core/exchange/README.md, "Bundle size"): the phone packs whole records, oldest
// first, into bundles whose JSON stays under a byte budget well below the receiver's stated limit. A record
// larger than the budget travels alone. Pure: the outbox in web/db measures and calls these.

/** The budget when the receiver states no limit, bytes of bundle JSON (UTF-8): 4 MiB, a quarter of the receiver's default 16 MiB. */
export const DEFAULT_BUNDLE_BYTES = 4 * 1024 * 1024;
/** The smallest budget a refusal as too large can bring the phone down to, bytes (1 KiB; a larger record then travels alone). */
export const MIN_BUNDLE_BYTES = 1024;
/** The answer header in which a receiver states the largest bundle it takes, in bytes (decimal digits). */
export const MAX_BUNDLE_BYTES_HEADER = 'Freshet-Max-Bundle-Bytes';

/** Bytes of `text` in UTF-8 (a lone surrogate counts 3, as an encoder writes U+FFFD). */
export function utf8Length(text: string): number {
  let n = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c < 0x80) n += 1;
    else if (c < 0x800) n += 2;
    else if (c >= 0xd800 && c <= 0xdbff && i + 1 < text.length && (text.charCodeAt(i + 1) & 0xfc00) === 0xdc00) {
      n += 4;
      i++;
    } else n += 3;
  }
  return n;
}

/** The receiver's stated limit from the header value: a whole number of bytes from 1 KiB up; undefined otherwise. */
export function statedLimit_bytes(header: string | null | undefined): number | undefined {
  if (header === null || header === undefined || !/^\s*\d{4,12}\s*$/.test(header)) return undefined;
  const n = Number(header);
  return n >= 1024 ? n : undefined;
}

/** What limits the next bundle: the receiver's stated limit and a budget lowered after a refusal as too large, bytes. */
export interface BundleLimits {
  stated_bytes?: number;
  lowered_bytes?: number;
}

/** The byte budget of the next bundle: 4 MiB, at most ¾ of the stated limit, at most a lowered budget (itself never under 1 KiB). */
export function bundleBudget(limits: BundleLimits): number {
  let budget = DEFAULT_BUNDLE_BYTES;
  if (limits.stated_bytes !== undefined) budget = Math.min(budget, Math.floor((limits.stated_bytes * 3) / 4));
  if (limits.lowered_bytes !== undefined) budget = Math.min(budget, Math.max(MIN_BUNDLE_BYTES, limits.lowered_bytes));
  return budget;
}

/**
 * How many of the waiting records (sizes in bytes of their JSON, oldest first) go in the next bundle: as
 * many as keep the bundle's JSON (envelope_bytes for the bundle with no records, plus one comma between
 * records) within budget_bytes, at most maxRecords, and always at least the first (a record larger than
 * the budget travels alone). 0 only when nothing waits.
 */
export function recordsThatFit(sizes: readonly number[], envelope_bytes: number, budget_bytes: number, maxRecords: number): number {
  if (sizes.length === 0) return 0;
  let total = envelope_bytes + sizes[0];
  let n = 1;
  while (n < sizes.length && n < maxRecords && total + 1 + sizes[n] <= budget_bytes) {
    total += 1 + sizes[n];
    n++;
  }
  return n;
}
