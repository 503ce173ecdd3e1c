// Errors as a user reads them: sentences about the field as the form names it, never an internal name
// (`time_ms`, `separateBaseflow`) or a raw millisecond count. Pure: no DOM, so it is tested in Node.
import { displayUnit, RecordValidationError, toDisplay, toLocalInput, type DisplayQuantity, type UnitSystem } from '../core';
import { StorageError } from './db/errors';

/** What the screen was doing, the site's units and zone: so numbers and times are shown as the user knows them. */
export interface PlainContext {
  doing?: 'save' | 'read';
  units?: UnitSystem;
  timeZone?: string;
  /** Words of the screen for terms in a message (e.g. a method's kind → its name), applied first. */
  terms?: Readonly<Record<string, string>>;
  /** The sentence when a message still holds an internal name after translation (a screen's own wording). */
  fallback?: string;
}

/** Names of fields (the last part of a record path) as the forms label them, with their quantity for units. */
const FIELDS: Record<string, { label: string; quantity?: DisplayQuantity }> = {
  time_ms: { label: 'the time' },
  stage_m: { label: 'the stage', quantity: 'stage' },
  discharge_m3s: { label: 'the discharge', quantity: 'discharge' },
  area_km2: { label: 'the catchment area', quantity: 'area' },
  jumpLimit_m: { label: 'the jump limit', quantity: 'stage' },
  elevation_m: { label: 'the datum elevation', quantity: 'stage' },
  accuracy_m: { label: 'the location accuracy', quantity: 'length' },
  lat: { label: 'the latitude' },
  lon: { label: 'the longitude' },
  observer: { label: 'the observer' },
  note: { label: 'the note' },
  code: { label: 'the site code' },
  name: { label: 'the site name' },
  description: { label: 'the gauge datum' },
  timeZone: { label: 'the time zone' },
  siteId: { label: 'the site' },
  source: { label: '“read from”' },
  quality: { label: 'the quality' },
  warnings: { label: 'the warnings' },
  riseStart_ms: { label: 'the rise start' },
  peak_ms: { label: 'the peak' },
  inflection_ms: { label: 'the inflection point' },
  runoffEnd_ms: { label: 'the end of direct runoff' },
  from_ms: { label: 'the start of the window' },
  to_ms: { label: 'the end of the window' },
  end_ms: { label: 'the end' },
  rainfall_mm: { label: 'the rainfall', quantity: 'depth' },
  depth_mm: { label: 'the depth', quantity: 'depth' },
  depth_m: { label: 'the depth', quantity: 'length' },
  velocity_mps: { label: 'the velocity', quantity: 'velocity' },
  offset_m: { label: 'the offset', quantity: 'stage' },
  shift_m: { label: 'the shift', quantity: 'stage' },
  gaugedRange_m: { label: 'the gauged range', quantity: 'stage' },
  baseflowAtPoints: { label: 'the baseflow at the key points' },
  interval_days: { label: 'the interval' },
  bfiMax: { label: 'the largest baseflow index' },
};

/** Calculations named in core messages, as the screens describe them. */
const CALCULATIONS: Record<string, string> = {
  separateBaseflow: 'The baseflow separation',
  separateBaseflowDetailed: 'The baseflow separation',
  findEventPoints: 'Finding the storm',
  findEventPointsDetailed: 'Finding the storm',
  summarizeEvent: 'The storm summary',
  unitHydrograph: 'The unit hydrograph',
  fitRating: 'The rating fit',
  fitSegments: 'The rating fit',
  ratingFromTable: 'The rating table',
  midSection: 'The discharge measurement',
  checkReading: 'The reading check',
  dischargeAt: 'The discharge',
  stageAt: 'The stage',
  ratingTable: 'The rating table',
  inflectionByNewtonPolynomial: 'The polynomial cross-check',
};

/** An internal name or raw time left in a sentence: snake_case with a unit, camelCase words, 11+ digit counts, "ms". */
export const INTERNAL_WORDS = /\b[a-z]+(?:[A-Z][a-z0-9]*)+\b|\b[A-Za-z]+_[A-Za-z0-9_]+\b|\d{11,}|\bms\b|epoch|UTC milliseconds|RangeError|NaN/;

const capital = (s: string): string => s.charAt(0).toUpperCase() + s.slice(1);

function numberText(v: number): string {
  return Number(v.toPrecision(6)).toLocaleString('en', { maximumFractionDigits: 6 }).replace(/^-/, '−');
}

/** A field path such as "segments[1].exponent" or "datum.elevation_m" as the user's name of it. */
function fieldLabel(path: string): { label: string; quantity?: DisplayQuantity } {
  const last = path.replace(/\[\d+\]/g, '').split('.').pop() ?? path;
  return FIELDS[last] ?? { label: `the ${last.replace(/_[a-z0-9]+$/, '').replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase()}` };
}

/** What a refused field needs, from the validator's structured wording, in the user's units. */
function needs(expected: string, quantity: DisplayQuantity | undefined, units: UnitSystem): string {
  if (/UTC epoch milliseconds/.test(expected)) return 'must be a date and time from 1970 onwards; check the year';
  const num = /^a finite number(?: from (\S+) to (\S+)| ≥ (\S+)| ≤ (\S+))?(?: \((.+)\))?$/.exec(expected);
  if (num) {
    const [, from, to, atLeast, atMost, unit] = num;
    const show = (x: string) => (quantity && unit ? numberText(toDisplay(quantity, Number(x), units)) : numberText(Number(x)));
    const u = quantity && unit ? ` ${displayUnit(quantity, units)}` : unit && unit !== 'degrees' ? ` ${unit}` : unit === 'degrees' ? ' degrees' : '';
    // Number.MIN_VALUE as the least means "above zero".
    const aboveZero = (x: string) => Number(x) > 0 && Number(x) < 1e-300;
    if (from !== undefined) return aboveZero(from) ? `must be a number above 0 and at most ${show(to)}${u}` : `must be a number from ${show(from)} to ${show(to)}${u}`;
    if (atLeast !== undefined) return aboveZero(atLeast) ? 'must be a number above 0' : `must be a number of at least ${show(atLeast)}${u}`;
    if (atMost !== undefined) return `must be a number of at most ${show(atMost)}${u}`;
    return 'must be a number';
  }
  const bad = /^text without .* pairs; it holds (.+)$/.exec(expected);
  if (bad) return `holds ${bad[1]}; remove it (tab and new line are fine)`;
  const text = /(non-empty )?text of at most (\d+) characters/.exec(expected);
  if (text) return `${text[1] ? 'is needed and ' : ''}must be at most ${Number(text[2]).toLocaleString('en')} characters long`;
  if (/^one of /.test(expected)) return 'must be one of the choices offered';
  if (/time zone/.test(expected)) return 'must be a time zone from the list';
  return 'is not accepted';
}

/** A core sentence with internal names replaced by the user's words; undefined when some remain. */
function plainCoreSentence(message: string, ctx: PlainContext): string | undefined {
  let m = message.replace(/^([a-z]+[A-Z]\w*)(:| needs)/, (_all, fn: string, sep: string) => (CALCULATIONS[fn] ?? 'This calculation') + (sep === ':' ? ':' : ' needs'));
  m = m.replace(/\b(\d{11,})\b(\s*ms\b)?/g, (_all, digits: string) => (ctx.timeZone ? toLocalInput(Number(digits), ctx.timeZone).replace('T', ' ') : 'a time'));
  m = m.replace(/ (?:in )?UTC (?:epoch )?(?:ms|milliseconds)\b/g, '').replace(/\bas a finite time in ms\b/g, 'as a time');
  m = m.replace(/\b[A-Za-z]+_[A-Za-z0-9]+\b|\b[a-z]+(?:[A-Z][a-z0-9]*)+\b/g, (name) => (FIELDS[name] ? FIELDS[name].label : name));
  return INTERNAL_WORDS.test(m) ? undefined : capital(m);
}

/** The sentence to show for anything thrown while saving or reading records, or by a core calculation. */
export function plainError(err: unknown, ctx: PlainContext = {}): string {
  if (err instanceof StorageError) {
    if (ctx.doing === 'read' && (err.reason === 'unknown' || err.reason === 'aborted')) {
      return 'Freshet could not read its stored data just now; nothing was changed. Reload the page and try again.';
    }
    return err.message;
  }
  if (err instanceof RecordValidationError) {
    const { label, quantity } = fieldLabel(err.field);
    return `${capital(label)} ${needs(err.expected, quantity, ctx.units ?? 'metric')}.`;
  }
  if (err instanceof Error && err.name === 'NotFoundError') return 'That record is not on this phone.';
  let message = err instanceof Error ? err.message : String(err);
  for (const [term, words] of Object.entries(ctx.terms ?? {})) message = message.split(term).join(words);
  const plain = plainCoreSentence(message, ctx);
  if (plain) return /[.?!]$/.test(plain) ? plain : `${plain}.`;
  if (ctx.fallback) return ctx.fallback;
  return ctx.doing === 'read'
    ? 'Freshet could not read its stored data just now; nothing was changed. Reload the page and try again.'
    : 'This could not be worked out from the values given; nothing was changed. Check the times and numbers, then try again.';
}

/** The sentence for a refused or failed location request (the browser's own text is not shown). */
export function locationProblem(err: { code: number }): string {
  // GeolocationPositionError codes (W3C Geolocation API): 1 permission denied, 2 unavailable, 3 timeout.
  if (err.code === 1) return 'Location is off for this app. Allow location for this site in the browser’s settings to use it.';
  if (err.code === 3) return 'The phone took too long to find its location. Try again in the open, away from steep banks.';
  return 'The phone could not find its location just now.';
}
