// Room for photos on this phone: the browser's estimate of what Freshet may store and uses
// (navigator.storage.estimate), and the sentence to show before another photo is taken when one more
// would leave less than a tenth of it free. Pure apart from photoRoom, which asks the browser.

/** A photo is expected to take about this much (a resized 2,048 px JPEG), bytes: common practice, from memory. */
export const TYPICAL_PHOTO_BYTES = 1_000_000;
/** The share of the quota that should stay free after one more photo. */
export const LOW_ROOM_SHARE = 0.1;

function mb(bytes: number): string {
  return bytes >= 10 * 1024 ** 2 ? `${Math.round(bytes / 1024 ** 2)} MB` : `${(bytes / 1024 ** 2).toFixed(1)} MB`;
}

/** The warning for `usage` of `quota` bytes with `adding` bytes more, or undefined when there is room. */
export function roomWarning(usage: number | undefined, quota: number | undefined, adding = TYPICAL_PHOTO_BYTES): string | undefined {
  if (usage === undefined || quota === undefined || !(quota > 0) || !(usage >= 0)) return undefined;
  const left = quota - usage - adding;
  if (left >= LOW_ROOM_SHARE * quota) return undefined;
  const free = Math.max(0, quota - usage);
  return `Little room is left for Freshet on this phone (about ${mb(free)}). Send your records and photos to the office, or free some space, before taking many more photos.`;
}

/** The warning now, from the browser's estimate (none when the browser gives no estimate). */
export async function photoRoom(adding = TYPICAL_PHOTO_BYTES): Promise<string | undefined> {
  const storage = typeof navigator !== 'undefined' ? navigator.storage : undefined;
  if (!storage?.estimate) return undefined;
  const e = await storage.estimate().catch(() => undefined);
  return roomWarning(e?.usage, e?.quota, adding);
}
