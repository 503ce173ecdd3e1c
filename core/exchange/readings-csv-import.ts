// Stage readings from a CSV file: a mapping says which line holds the header, which column is the time
// (ISO 8601 with a UTC offset), the stage (and its unit), and optionally the quality and a note. Every
// problem is reported with its line; one bad line means nothing is imported.
import { M_PER_FT } from '../units';
import { daysInMonth, utcOfCivil } from '../time/index';
import { MAX_ABS_STAGE_M, MAX_TEXT_LENGTH, READING_QUALITIES, textProblem, textProblemWords, validateReadingBody, type ReadingBody, type ReadingQuality, type ReadingSource } from '../records/index';
import { readCsvRecords, CsvSyntaxError } from './csv-read';
import { looksLikeFormula } from './csv-write';

/** Units a stage column may be in. */
export type CsvStageUnit = 'm' | 'cm' | 'ft';

/** Which column is what (0-based indexes) and how the file is laid out. */
export interface ReadingCsvMapping {
  delimiter: ',' | ';' | '\t';
  /** 1-based line of the header row, or 0 when the file has none. Data start on the next line. */
  headerLine: number;
  time: number;
  stage: number;
  stageUnit: CsvStageUnit;
  /** Decimal comma in numbers ("0,734"), common with ';' between fields. */
  decimalComma: boolean;
  quality?: number;
  note?: number;
  /** What the readings are (one source for the whole file). */
  source: ReadingSource;
  /** Quality given to rows without one. */
  defaultQuality: ReadingQuality;
}

/** One problem in a CSV import: its 1-based line and a sentence about it. */
export interface CsvProblem {
  line: number;
  message: string;
}

/** A CSV import refused: every problem found (up to MAX_CSV_PROBLEMS), each naming its line. */
export class CsvImportError extends RangeError {
  constructor(readonly problems: CsvProblem[]) {
    super(problems.length === 1 ? `Line ${problems[0].line}: ${problems[0].message}` : `${problems.length} lines have problems; the first, line ${problems[0].line}: ${problems[0].message}`);
    this.name = 'CsvImportError';
  }
}

/** Most problems listed before an import stops looking. */
export const MAX_CSV_PROBLEMS = 20;

const STAGE_PER_UNIT_M: Record<CsvStageUnit, number> = { m: 1, cm: 0.01, ft: M_PER_FT };
const ISO = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,9}))?)?\s*(Z|[+-]\d{2}:?\d{2})$/i;

/** UTC ms of an ISO 8601 time with offset ("2026-12-01T10:15:00+13:00"); a sentence when it is not one. */
export function parseIsoWithOffset(text: string): number | string {
  const m = ISO.exec(text.trim());
  if (!m) {
    return /^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?$/.test(text.trim())
      ? `the time "${text.trim()}" has no UTC offset; add one, e.g. ${text.trim()}+13:00 or ${text.trim()}Z`
      : `"${text.trim()}" is not a time like 2026-12-01T10:15:00+13:00`;
  }
  const [year, month, day, hour, minute, second] = m.slice(1, 7).map((v) => Number(v ?? 0));
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month) || hour > 23 || minute > 59 || second > 59) {
    return `"${text.trim()}" is not a real date and time`;
  }
  const ms = Number(((m[7] ?? '') + '000').slice(0, 3));
  const z = m[8].toUpperCase();
  const offset_min = z === 'Z' ? 0 : (z[0] === '-' ? -1 : 1) * (Number(z.slice(1, 3)) * 60 + Number(z.slice(-2)));
  if (Math.abs(offset_min) > 18 * 60) return `the UTC offset of "${text.trim()}" is beyond ±18:00`;
  return utcOfCivil(year, month, day, hour, minute, second) + ms - offset_min * 60_000;
}

/** A number typed in a cell: optional sign, digits, one decimal mark; spaces inside are refused. */
function parseNumber(text: string, decimalComma: boolean): number | null {
  const t = text.trim();
  const re = decimalComma ? /^[+-]?(\d+(,\d*)?|,\d+)$/ : /^[+-]?(\d+(\.\d*)?|\.\d+)$/;
  return re.test(t) ? Number(t.replace(',', '.')) : null;
}

/**
 * The readings of a CSV file for site `siteId`, in file order, or a CsvImportError listing the lines with
 * problems (nothing is returned then). Blank lines are skipped. A note that our own export neutralised
 * for spreadsheets (a leading apostrophe before = + - @) comes back without the apostrophe.
 */
export function parseReadingsCsv(text: string, mapping: ReadingCsvMapping, siteId: string): ReadingBody[] {
  let records;
  try {
    records = readCsvRecords(text, mapping.delimiter);
  } catch (e) {
    if (e instanceof CsvSyntaxError) throw new CsvImportError([{ line: e.line, message: e.message.replace(/^Line \d+: /, '') }]);
    throw e;
  }
  const problems: CsvProblem[] = [];
  const out: ReadingBody[] = [];
  const need = Math.max(mapping.time, mapping.stage, mapping.quality ?? -1, mapping.note ?? -1) + 1;
  const factor = STAGE_PER_UNIT_M[mapping.stageUnit];
  for (const r of records) {
    if (problems.length >= MAX_CSV_PROBLEMS) break;
    if (r.line <= mapping.headerLine) continue;
    if (r.fields.every((f) => f.trim() === '')) continue;
    const fail = (message: string) => problems.push({ line: r.line, message });
    if (r.fields.length < need) {
      fail(`expected at least ${need} columns; found ${r.fields.length} (is the separator right, or is the line cut short?)`);
      continue;
    }
    const time_ms = parseIsoWithOffset(r.fields[mapping.time]);
    if (typeof time_ms === 'string') {
      fail(time_ms);
      continue;
    }
    const raw = r.fields[mapping.stage];
    const stage = parseNumber(raw, mapping.decimalComma);
    if (stage === null) {
      fail(raw.trim() === '' ? 'the stage is empty' : `the stage "${raw.trim()}" is not a number${mapping.decimalComma ? ' with a decimal comma' : ''}, e.g. ${mapping.decimalComma ? '0,734' : '0.734'}`);
      continue;
    }
    const stage_m = stage * factor;
    if (Math.abs(stage_m) > MAX_ABS_STAGE_M) {
      fail(`the stage ${raw.trim()} ${mapping.stageUnit} is beyond ±${MAX_ABS_STAGE_M} m; is the unit right?`);
      continue;
    }
    let quality = mapping.defaultQuality;
    if (mapping.quality !== undefined) {
      const q = r.fields[mapping.quality].trim().toLowerCase();
      if (q !== '') {
        if (!(READING_QUALITIES as readonly string[]).includes(q)) {
          fail(`the quality "${r.fields[mapping.quality].trim()}" is not one of ${READING_QUALITIES.join(', ')}`);
          continue;
        }
        quality = q as ReadingQuality;
      }
    }
    let note = mapping.note === undefined ? '' : r.fields[mapping.note];
    if (note.startsWith("'") && looksLikeFormula(note.slice(1))) note = note.slice(1);
    // The text rule (core/records/text.ts): a Windows line end inside a quoted note becomes a new line.
    note = note.replace(/\r\n/g, '\n');
    const bad = textProblem(note);
    if (bad) {
      fail(`the note holds ${textProblemWords(bad)}, which Freshet does not store; remove it from the file and import again`);
      continue;
    }
    if (note.length > MAX_TEXT_LENGTH) {
      fail(`the note is ${note.length} characters long; at most ${MAX_TEXT_LENGTH} are kept`);
      continue;
    }
    const body: ReadingBody = { siteId, time_ms, stage_m, source: mapping.source, quality, observer: '', note, warnings: [] };
    try {
      validateReadingBody(body);
    } catch {
      fail('the reading is not valid (time or stage out of range)');
      continue;
    }
    out.push(body);
  }
  if (problems.length > 0) throw new CsvImportError(problems);
  return out;
}
