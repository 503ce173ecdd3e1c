// The length of a day in UTC milliseconds: the one spelling every layer uses.

/** Milliseconds in a day of 24 hours (UTC has no daylight saving; leap seconds are not counted). */
export const MS_PER_DAY = 86_400_000;
/** Milliseconds in an hour. */
export const MS_PER_HOUR = 3_600_000;
