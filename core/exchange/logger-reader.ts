// Reads a logger file's rows, one at a time as a streaming CSV parser hands them over, into times (UTC ms)
// and levels (m above the gauge datum), with every problem tied to its line. The CSV itself is split by
// the caller's parser; this module only interprets cells under a mapping.
import { checkLoggerMapping, metresPerLevelUnit, type LoggerMapping } from './logger-mapping';
import { stampParser, zoneResolver } from './logger-stamps';
import { textProblem, textProblemWords } from '../records/text';

/** A problem with one line of the file; column counts from 1 when the problem is in one cell. */
export interface LoggerProblem {
  line: number;
  column?: number;
  message: string;
}

/** A line whose time repeats an earlier line's: kept once (the earlier line), reported here. */
export interface LoggerDuplicate {
  line: number;
  firstLine: number;
  time_ms: number;
}

/** A stretch of lines whose wall time fell in the hour repeated when the clocks went back, read as after the change. */
export interface RepeatedHourLines {
  fromLine: number;
  toLine: number;
}

/** A backward step of the stamps in file order: line, and how far back from the line before, ms. */
export interface BackwardStep {
  line: number;
  back_ms: number;
}

/** The rows read so far: times (UTC ms, file order), levels (m above gauge datum), lines, and what went wrong. */
export interface LoggerRows {
  time_ms: Float64Array;
  level_m: Float64Array;
  line: Int32Array;
  /** Lines that could not be read; at most `problemLimit` kept, `problemCount` counts them all. */
  problems: LoggerProblem[];
  problemCount: number;
  /** Lines read as the second pass of a repeated hour (zone clocks only). */
  repeatedHour: RepeatedHourLines[];
  /** Places where the stamps go back in time (file order), first 50. */
  backwardSteps: BackwardStep[];
  /** Lines with data seen (blank lines and lines above the data not counted). */
  linesRead: number;
}

/** A streaming reader: push each row's cells with its line number, then finish once. */
export interface LoggerReader {
  push(cells: readonly string[], line: number): void;
  /** The rows read; endsWithLineBreak tells whether the file's last line was complete. */
  finish(endsWithLineBreak: boolean): LoggerRows;
}

const NUMBER_DOT = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;
const NUMBER_COMMA = /^[+-]?(\d+,?\d*|,\d+)(e[+-]?\d+)?$/i;

/** Growable Float64Array/Int32Array storage, doubled as rows come in. */
class Column<T extends Float64Array | Int32Array> {
  constructor(public data: T, private readonly make: (n: number) => T) {}
  size = 0;
  push(v: number): void {
    if (this.size === this.data.length) {
      const bigger = this.make(this.data.length * 2);
      bigger.set(this.data);
      this.data = bigger;
    }
    this.data[this.size++] = v;
  }
  done(): T {
    return this.data.slice(0, this.size) as T;
  }
}

/** A reader for rows of a logger file under `mapping`; throws a RangeError first if the mapping is incomplete. */
export function loggerReader(mapping: LoggerMapping, options: { problemLimit?: number } = {}): LoggerReader {
  checkLoggerMapping(mapping);
  const limit = options.problemLimit ?? 200;
  const scale = metresPerLevelUnit(mapping.levelUnit);
  const resolve = mapping.clock.kind === 'zone' ? zoneResolver(mapping.clock.timeZone) : undefined;
  const numberPattern = mapping.decimalMark === ',' ? NUMBER_COMMA : NUMBER_DOT;
  const parseStamp = stampParser(mapping.timeFormat);
  const needCells = Math.max(mapping.timeColumn, mapping.levelColumn, mapping.dateColumn ?? 0);
  const time = new Column(new Float64Array(1024), (n) => new Float64Array(n));
  const level = new Column(new Float64Array(1024), (n) => new Float64Array(n));
  const lines = new Column(new Int32Array(1024), (n) => new Int32Array(n));
  const problems: LoggerProblem[] = [];
  let problemCount = 0;
  const repeatedHour: RepeatedHourLines[] = [];
  const backwardSteps: BackwardStep[] = [];
  let linesRead = 0;
  let prev_ms = -Infinity;
  let usualCells = 0;
  let prevRepeated = false;
  let last: { line: number; cells: number; ok: boolean } | undefined;

  const problem = (line: number, message: string, column?: number) => {
    problemCount++;
    if (problems.length < limit) problems.push(column === undefined ? { line, message } : { line, column, message });
  };

  function push(cells: readonly string[], line: number): void {
    if (line < mapping.firstDataLine) return;
    if (cells.length === 0 || (cells.length === 1 && cells[0].trim() === '')) return;
    linesRead++;
    last = { line, cells: cells.length, ok: false };
    if (cells.length < needCells) {
      problem(line, `Line ${line} has ${cells.length} field${cells.length === 1 ? '' : 's'}; the mapping needs ${needCells} (time in field ${mapping.timeColumn}, level in field ${mapping.levelColumn}).`);
      return;
    }
    // The text rule (core/records/text.ts): a NUL or other control character in a cell the mapping reads
    // is named as such (it would not show in a quoted cell), with its line and field.
    for (const column of [mapping.dateColumn, mapping.timeColumn, mapping.levelColumn]) {
      const bad = column === undefined ? undefined : textProblem(cells[column - 1]);
      if (bad) {
        problem(line, `Line ${line}, field ${column} holds ${textProblemWords(bad)}; a logger file holds only times and numbers there.`, column);
        return;
      }
    }
    const timeText = mapping.dateColumn === undefined
      ? cells[mapping.timeColumn - 1]
      : `${cells[mapping.dateColumn - 1].trim()} ${cells[mapping.timeColumn - 1].trim()}`;
    const stamp = parseStamp(timeText);
    if (typeof stamp === 'string') {
      problem(line, `Line ${line}, field ${mapping.timeColumn}: ${stamp}.`, mapping.timeColumn);
      return;
    }
    const levelText = cells[mapping.levelColumn - 1].trim();
    if (!numberPattern.test(levelText)) {
      const shown = levelText === '' ? 'is empty' : `holds "${levelText.slice(0, 40)}"`;
      problem(line, `Line ${line}, field ${mapping.levelColumn} ${shown}; a level is needed as a number${mapping.decimalMark === ',' ? ' with a decimal comma' : ''}, like ${mapping.decimalMark === ',' ? '0,734' : '0.734'}.`, mapping.levelColumn);
      return;
    }
    const value = Number(mapping.decimalMark === ',' ? levelText.replace(',', '.') : levelText);
    let t: number;
    let repeated = false;
    if (stamp.offset_min !== undefined) {
      t = stamp.naive_ms - stamp.offset_min * 60_000;
    } else if (mapping.clock.kind === 'fixed-offset') {
      t = stamp.naive_ms - mapping.clock.offset_min * 60_000;
    } else if (mapping.clock.kind === 'zone' && resolve) {
      const candidates = resolve(stamp.naive_ms);
      if (candidates.length === 0) {
        problem(line, `Line ${line}: ${timeText.trim()} does not exist in ${mapping.clock.timeZone} (the clocks went forward over it); a logger that keeps standard time all year should be read with a fixed offset.`, mapping.timeColumn);
        return;
      }
      t = candidates[0];
      if (candidates.length > 1 && prev_ms >= candidates[0]) {
        // The wall time shows twice: after a stamp at or past its first instant, it is the second pass.
        t = candidates[candidates.length - 1];
        const r = repeatedHour[repeatedHour.length - 1];
        if (r && prevRepeated) r.toLine = line;
        else repeatedHour.push({ fromLine: line, toLine: line });
        repeated = true;
      }
    } else {
      problem(line, `Line ${line}: the time "${timeText.trim()}" has no UTC offset, but the mapping says every stamp carries one; choose the clock the logger keeps.`, mapping.timeColumn);
      return;
    }
    if (t < prev_ms && backwardSteps.length < 50) backwardSteps.push({ line, back_ms: prev_ms - t });
    prev_ms = t;
    prevRepeated = repeated;
    if (usualCells === 0) usualCells = cells.length;
    time.push(t);
    level.push(value * scale + mapping.datumOffset_m);
    lines.push(line);
    last.ok = true;
  }
  function finish(endsWithLineBreak: boolean): LoggerRows {
    if (last && !endsWithLineBreak && usualCells > 0 && last.cells < usualCells) {
      const message = `Line ${last.line} has ${last.cells} field${last.cells === 1 ? '' : 's'} where the lines before have ${usualCells}: the file looks cut off at the end.`;
      if (last.ok) {
        time.size--;
        level.size--;
        lines.size--;
        problem(last.line, message);
      } else if (problems.length > 0 && problems[problems.length - 1].line === last.line) {
        problems[problems.length - 1] = { line: last.line, message };
      } else {
        problem(last.line, message);
      }
    }
    return {
      time_ms: time.done(), level_m: level.done(), line: lines.done(), problems, problemCount, repeatedHour, backwardSteps, linesRead,
    };
  }

  return { push, finish };
}
