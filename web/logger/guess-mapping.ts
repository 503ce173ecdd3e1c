// A first suggestion for the mapping step from the first lines of a file: where the data start, which
// columns hold the time and the level, the time format, the decimal mark. Everything here is shown to
// the user to confirm; the clock of the stamps is never suggested (it must be asked).
import { LOGGER_TIME_FORMATS, parseStamp, type LoggerMapping, type LoggerTimeFormat } from '../../core';

/** The mapping without its clock, which the user must choose. */
export type MappingWithoutClock = Omit<LoggerMapping, 'clock'>;

const NUMBER = /^[+-]?(\d+([.,]\d*)?|[.,]\d+)$/;

function formatOf(cell: string): LoggerTimeFormat | undefined {
  const ok = LOGGER_TIME_FORMATS.filter((f) => typeof parseStamp(cell, f) !== 'string');
  // 01/03/2026 reads both ways: prefer day-month-year (ISO-minded field crews), the user can change it.
  return ok[0];
}

/** A suggested mapping for preview rows (cells per line, from line 1) split with `delimiter`. */
export function guessMapping(rows: readonly (readonly string[])[], delimiter: string): MappingWithoutClock {
  let firstDataLine = 1;
  let timeColumn = 1;
  let dateColumn: number | undefined;
  let timeFormat: LoggerTimeFormat = 'year-month-day';
  let levelColumn = 2;
  for (let i = 0; i < rows.length; i++) {
    const cells = rows[i].map((c) => c.trim());
    const t = cells.findIndex((c) => formatOf(c) !== undefined);
    if (t >= 0) {
      firstDataLine = i + 1;
      timeColumn = t + 1;
      timeFormat = formatOf(cells[t])!;
    } else {
      // A date column followed by a time column (e.g. 01.03.2026;10:00:00).
      const d = cells.findIndex((c, k) => k + 1 < cells.length && /^\d{1,2}:\d{2}(:\d{2})?$/.test(cells[k + 1]) && formatOf(`${c} ${cells[k + 1]}`) !== undefined);
      if (d < 0) continue;
      firstDataLine = i + 1;
      dateColumn = d + 1;
      timeColumn = d + 2;
      timeFormat = formatOf(`${cells[d]} ${cells[d + 1]}`)!;
    }
    const after = cells.findIndex((c, k) => k + 1 > timeColumn && NUMBER.test(c));
    levelColumn = after >= 0 ? after + 1 : timeColumn + 1;
    break;
  }
  const sample = rows.slice(firstDataLine - 1, firstDataLine + 9).map((r) => (r[levelColumn - 1] ?? '').trim());
  const decimalMark = delimiter !== ',' && sample.some((c) => /^[+-]?\d*,\d+$/.test(c)) ? ',' : '.';
  const d = delimiter === ';' || delimiter === '\t' ? delimiter : ',';
  return {
    firstDataLine, delimiter: d, decimalMark, timeColumn, timeFormat, levelColumn, levelUnit: 'm', datumOffset_m: 0,
    ...(dateColumn !== undefined && { dateColumn }),
  };
}
