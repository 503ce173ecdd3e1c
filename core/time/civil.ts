// Dates of the proleptic Gregorian calendar as UTC milliseconds, by arithmetic. `Date.UTC` is not used
// because it reads years 0–99 as 1900–1999, so a typed year 0070 would become 1970.
import { MS_PER_DAY } from './day';

/** True for a Gregorian leap year (divisible by 4, except centuries not divisible by 400). */
export function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

/** Days in month 1–12 of year (28–31). */
export function daysInMonth(year: number, month: number): number {
  return month === 2 ? (isLeapYear(year) ? 29 : 28) : [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][month - 1];
}

/** Days from 1970-01-01 to year-month-day (negative before it), for any integer year. */
export function daysFromCivil(year: number, month: number, day: number): number {
  // The era-based count of days (400-year cycles of 146097 days), exact for every integer year.
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const mp = (month + 9) % 12;
  const doy = Math.floor((153 * mp + 2) / 5) + day - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

/** UTC epoch milliseconds of a calendar date and clock time read as UTC (years 0–99 stay 0–99). */
export function utcOfCivil(year: number, month: number, day: number, hour = 0, minute = 0, second = 0): number {
  return daysFromCivil(year, month, day) * MS_PER_DAY + ((hour * 60 + minute) * 60 + second) * 1000;
}
