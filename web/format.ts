// Numbers and times as the screens show them: always with a unit, never NaN.
import { displayUnit, STAGE_DECIMALS, toDisplay, toLocalInput, type DisplayQuantity, type UnitSystem } from '../core';

/** A value in display units with its unit label; '—' when there is no value. */
export function formatQuantity(quantity: DisplayQuantity, value_si: number | undefined, units: UnitSystem): string {
  if (value_si === undefined || !Number.isFinite(value_si)) return '—';
  const v = toDisplay(quantity, value_si, units);
  const unit = displayUnit(quantity, units);
  switch (quantity) {
    case 'stage':
    case 'length':
      return `${v.toFixed(STAGE_DECIMALS[units])} ${unit}`;
    case 'discharge':
    case 'velocity':
      return `${significant(v)} ${unit}`;
    case 'area':
      return `${significant(v)} ${unit}`;
    case 'depth':
      return `${v.toFixed(units === 'us' ? 2 : 1)} ${unit}`;
    case 'volume':
      return `${Math.round(v) >= 1000 ? Math.round(v).toLocaleString('en') : significant(v)} ${unit}`;
  }
}

/** Three significant figures, the usual precision of a rated discharge; plain 0 for zero. */
export function significant(v: number, digits = 3): string {
  if (v === 0) return '0';
  const abs = Math.abs(v);
  if (abs >= 10 ** digits) return Math.round(v).toLocaleString('en');
  const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(abs)));
  return v.toFixed(Math.min(decimals, 6));
}

/** "5 min ago", "3 h ago", "2 days ago" from two UTC ms times. */
export function formatAgo(time_ms: number, now_ms: number): string {
  const d = now_ms - time_ms;
  if (d < 0) return 'in the future';
  const min = Math.floor(d / 60_000);
  if (min < 1) return 'just now';
  if (min < 60) return `${min} min ago`;
  const h = Math.floor(min / 60);
  if (h < 48) return `${h} h ago`;
  return `${Math.floor(h / 24)} days ago`;
}

/** A time in the site's zone as "YYYY-MM-DD HH:mm". */
export function formatTime(time_ms: number, timeZone: string): string {
  return toLocalInput(time_ms, timeZone).replace('T', ' ');
}

const quoted = (t: string): string => `"${t.length > 24 ? `${t.slice(0, 20)}…` : t}"`;

/** A plain sentence when a typed number has a space inside it ("1 2"), else undefined. */
export function spaceInsideNumber(text: string): string | undefined {
  const t = text.trim();
  // A space inside a number is refused, never joined: "1 2" might be 12, 1.2 or two readings.
  return /\d\s+[\d.,]|[.,]\s+\d/.test(t) ? `${quoted(t)} has a space inside the number. Type it without spaces, like 12 or 1.2.` : undefined;
}

/** Why a typed number cannot be read (a plain sentence), or undefined when it reads as a number. */
export function decimalProblem(text: string): string | undefined {
  const t = text.trim();
  if (readDecimal(t) !== undefined) return undefined;
  return spaceInsideNumber(t) ?? `${quoted(t)} is not a number. Type digits with a point or a comma for the decimals, like 12.5 or 12,5.`;
}

/** Parses a number typed on a phone keypad: a comma or a point as the decimal mark; no spaces inside. */
export function parseDecimal(text: string): number | undefined {
  return readDecimal(text.trim());
}

function readDecimal(t: string): number | undefined {
  const s = t.replace(',', '.');
  if (!/^[-+−]?(\d+\.?\d*|\.\d+)$/.test(s)) return undefined;
  const v = Number(s.replace('−', '-'));
  return Number.isFinite(v) ? v : undefined;
}
