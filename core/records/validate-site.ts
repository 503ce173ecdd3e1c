// Validation of a site's fields.
import type { SiteBody } from './types';
import { requireLatLon, requireNumber, requireObject, requireOneOf, requireText } from './checks';
import { RecordValidationError } from './validation-error';

/** Largest catchment area accepted, km²: above the Amazon basin's (about 7 million km², from memory), so larger is a typing slip. */
export const MAX_AREA_KM2 = 10_000_000;
/** Largest jump limit accepted, m: a stage change beyond 100 m between readings is no gauge's. */
export const MAX_JUMP_LIMIT_M = 100;

/** Lowest and highest datum elevation accepted, m: deeper than the deepest ocean or above the highest peaks is a slip. */
export const MIN_DATUM_ELEVATION_M = -11_000;
/** Highest datum elevation accepted, m. */
export const MAX_DATUM_ELEVATION_M = 9_000;

const zoneCache = new Set<string>();

/** True when the runtime knows `zone` as an IANA time zone name. */
export function isTimeZone(zone: string): boolean {
  if (zoneCache.has(zone)) return true;
  try {
    new Intl.DateTimeFormat('en', { timeZone: zone });
  } catch {
    return false;
  }
  zoneCache.add(zone);
  return true;
}

/** Checks a site's fields (not its envelope); throws a RecordValidationError naming the first bad field. */
export function validateSiteBody(x: unknown): asserts x is SiteBody {
  const k = 'site';
  const o = requireObject(k, 'site', x);
  requireText(k, 'code', o.code, true, 40);
  requireText(k, 'name', o.name, true, 200);
  if (o.area_km2 !== undefined) requireNumber(k, 'area_km2', o.area_km2, 'km²', Number.MIN_VALUE, MAX_AREA_KM2);
  if (o.datum !== undefined) {
    const d = requireObject(k, 'datum', o.datum);
    requireText(k, 'datum.description', d.description, false, 1000);
    if (d.elevation_m !== undefined) requireNumber(k, 'datum.elevation_m', d.elevation_m, 'm', MIN_DATUM_ELEVATION_M, MAX_DATUM_ELEVATION_M);
  }
  if (o.location !== undefined) requireLatLon(k, 'location', o.location);
  if (typeof o.timeZone !== 'string' || !isTimeZone(o.timeZone)) {
    throw new RecordValidationError(k, 'timeZone', 'an IANA time zone name such as "Europe/Oslo"', o.timeZone);
  }
  requireOneOf(k, 'displayUnits', o.displayUnits, ['metric', 'us']);
  requireNumber(k, 'jumpLimit_m', o.jumpLimit_m, 'm', Number.MIN_VALUE, MAX_JUMP_LIMIT_M);
}
