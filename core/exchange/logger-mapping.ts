// How to read a water-level logger file: which line the data start on, which columns hold the time and
// the level, the time format, the clock the stamps were written in, and the level's unit. The clock has
// no default on purpose: loggers often keep local standard time all year, and that must be asked.
import { M_PER_FT } from '../units';

/** How the date and time are written in the time column (date column joined in front when separate). */
export type LoggerTimeFormat =
  /** 2026-03-01 14:15[:00] or 2026-03-01T14:15:00, date separators - or /, optional Z or ±hh:mm offset. */
  | 'year-month-day'
  /** 01/03/2026 14:15[:00], separators / . or -, four-digit year. */
  | 'day-month-year'
  /** 03/01/2026 14:15[:00], separators / . or -, four-digit year. */
  | 'month-day-year';

/** All time formats, in the order screens list them. */
export const LOGGER_TIME_FORMATS: readonly LoggerTimeFormat[] = ['year-month-day', 'day-month-year', 'month-day-year'];

/**
 * The clock the stamps were written in: a fixed offset from UTC (UTC itself, or local standard time with
 * no daylight saving), a zone's local clock that changes for daylight saving (IANA name), or offsets
 * written in every stamp.
 */
export type LoggerClock =
  | { kind: 'fixed-offset'; offset_min: number }
  | { kind: 'zone'; timeZone: string }
  | { kind: 'in-stamp' };

/** Units a logger writes its level in; kPa is pressure read as a head of fresh water. */
export type LoggerLevelUnit = 'm' | 'cm' | 'ft' | 'kPa';

/** All level units, in the order screens list them. */
export const LOGGER_LEVEL_UNITS: readonly LoggerLevelUnit[] = ['m', 'cm', 'ft', 'kPa'];

/** Standard acceleration of gravity, m/s² (exact by definition, 3rd CGPM 1901). */
export const STANDARD_GRAVITY_MPS2 = 9.80665;
/** Density of fresh water used for pressure head, kg/m³: pure water at 15 °C, 999.1 (handbook value, from memory). */
export const FRESH_WATER_DENSITY_KGM3 = 999.1;

/** The mapping from a logger file's columns to stage readings. Columns and lines count from 1. */
export interface LoggerMapping {
  /** The first line that holds data (lines above it are headers), counted from 1. */
  firstDataLine: number;
  /** Field separator: ',' ';' or tab. */
  delimiter: ',' | ';' | '\t';
  /** Decimal mark in number cells: '.' or ',' (with ';' or tab separators). */
  decimalMark: '.' | ',';
  /** Column of the date when the date and time are in separate columns; absent when one column holds both. */
  dateColumn?: number;
  /** Column of the time (or of the date and time). */
  timeColumn: number;
  timeFormat: LoggerTimeFormat;
  /** The clock of the stamps: must be chosen by the user, never guessed. */
  clock: LoggerClock;
  /** Column of the level. */
  levelColumn: number;
  levelUnit: LoggerLevelUnit;
  /** Added to the level after conversion to metres (e.g. the sensor's height above the gauge datum), m. */
  datumOffset_m: number;
}

/** Metres per one unit of level: 1, 0.01, 0.3048 (exact) or the head of 1 kPa of fresh water. */
export function metresPerLevelUnit(unit: LoggerLevelUnit): number {
  switch (unit) {
    case 'm':
      return 1;
    case 'cm':
      return 0.01;
    case 'ft':
      return M_PER_FT;
    case 'kPa':
      // h = p / (ρ g): 1000 Pa / (999.1 kg/m³ × 9.80665 m/s²) ≈ 0.10206 m.
      return 1000 / (FRESH_WATER_DENSITY_KGM3 * STANDARD_GRAVITY_MPS2);
    default: {
      const none: never = unit;
      throw new RangeError(`Unknown level unit ${String(none)}; use m, cm, ft or kPa`);
    }
  }
}

function column(name: string, x: unknown): void {
  if (typeof x !== 'number' || !Number.isInteger(x) || x < 1 || x > 500) {
    throw new RangeError(`The ${name} column must be a column number from 1 to 500; got ${String(x)}`);
  }
}

/** Checks a mapping; throws a RangeError that says which choice is missing or wrong. */
export function checkLoggerMapping(m: LoggerMapping): void {
  if (!Number.isInteger(m.firstDataLine) || m.firstDataLine < 1) {
    throw new RangeError(`The data must start on a line number of 1 or more; got ${String(m.firstDataLine)}`);
  }
  if (![',', ';', '\t'].includes(m.delimiter)) throw new RangeError('The field separator must be a comma, a semicolon or a tab');
  if (m.decimalMark !== '.' && m.decimalMark !== ',') throw new RangeError('The decimal mark must be a point or a comma');
  if (m.decimalMark === ',' && m.delimiter === ',') {
    throw new RangeError('A decimal comma needs another field separator (semicolon or tab)');
  }
  column('time', m.timeColumn);
  if (m.dateColumn !== undefined) column('date', m.dateColumn);
  column('level', m.levelColumn);
  if (m.levelColumn === m.timeColumn || m.levelColumn === m.dateColumn) throw new RangeError('The level column must differ from the time and date columns');
  if (!LOGGER_TIME_FORMATS.includes(m.timeFormat)) throw new RangeError(`Unknown time format; use one of ${LOGGER_TIME_FORMATS.join(', ')}`);
  if (!LOGGER_LEVEL_UNITS.includes(m.levelUnit)) throw new RangeError(`Unknown level unit; use one of ${LOGGER_LEVEL_UNITS.join(', ')}`);
  if (!Number.isFinite(m.datumOffset_m) || Math.abs(m.datumOffset_m) > 1000) {
    throw new RangeError(`The datum offset must be a number of metres between −1000 and 1000; got ${String(m.datumOffset_m)}`);
  }
  const c = m.clock as LoggerClock | undefined;
  if (!c) throw new RangeError('Choose the clock the logger keeps (UTC, local standard time, or local time with daylight saving): it is never guessed');
  if (c.kind === 'fixed-offset') {
    if (!Number.isInteger(c.offset_min) || Math.abs(c.offset_min) > 14 * 60) {
      throw new RangeError(`A fixed offset must be whole minutes between −14:00 and +14:00; got ${String(c.offset_min)}`);
    }
  } else if (c.kind === 'zone') {
    if (typeof c.timeZone !== 'string' || c.timeZone.length === 0) throw new RangeError('Name the time zone of the logger clock (e.g. Europe/London)');
  } else if (c.kind !== 'in-stamp') {
    throw new RangeError('Unknown logger clock; use a fixed offset, a time zone, or offsets written in the stamps');
  }
}
