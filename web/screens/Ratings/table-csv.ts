// Rating tables as CSV: reading one the office hands out (stage, discharge). Writing one is core's
// ratingTablesToCsv, the one writer for the export and the rating screen.
// Pure: text in, rows out; every refusal names the line.
import { CsvSyntaxError, M3S_PER_CFS, M_PER_FT, readCsvRecords, withoutBom, type CsvRecord, type TableRow, type UnitSystem } from '../../../core';
import { parseDecimal } from '../../format';

/** The rows of a table CSV in SI, and the units its header said (or the site's when it said none). */
export interface ParsedTable {
  rows: TableRow[];
  stageUnit: 'm' | 'ft';
  dischargeUnit: 'm³/s' | 'ft³/s';
}

/** A refusal of a table CSV: the 1-based line and what was wrong there. */
export class TableCsvError extends RangeError {
  readonly line: number;
  constructor(line: number, message: string) {
    super(`Line ${line}: ${message}`);
    this.name = 'TableCsvError';
    this.line = line;
  }
}

function stageUnitOf(header: string): 'm' | 'ft' | undefined {
  const h = header.toLowerCase();
  if (/\bft\b|feet|_ft\b|\(ft\)/.test(h) && !/ft3|ft³|cfs/.test(h)) return 'ft';
  if (/\bm\b|metre|meter|_m\b|\(m\)/.test(h)) return 'm';
  return undefined;
}

function dischargeUnitOf(header: string): 'm³/s' | 'ft³/s' | undefined {
  const h = header.toLowerCase();
  if (/cfs|ft3|ft³|ft\^3|cusec/.test(h)) return 'ft³/s';
  if (/m3|m³|m\^3|cumec|_m3s/.test(h)) return 'm³/s';
  return undefined;
}

/**
 * Reads a rating table: one (stage, discharge) pair a line, optionally a header line naming the columns
 * (whose units, m or ft and m³/s or ft³/s, are used when given; the site's units otherwise). The stage
 * and discharge columns are found by name ("stage"/"gauge height"/"h", "discharge"/"flow"/"q"), else
 * the first two. Blank lines are skipped. Refuses a line with a missing cell or text in a number cell,
 * naming the line; needs at least 3 rows.
 */
export function parseTableCsv(text: string, siteUnits: UnitSystem): ParsedTable {
  const body = withoutBom(text);
  const firstLine = body.split(/\r\n|\n|\r/).find((l) => l.trim() !== '');
  if (firstLine === undefined) throw new TableCsvError(1, 'the file is empty; a table needs a stage and a discharge on each line.');
  // A semicolon file is the usual one where the decimal mark is a comma.
  const sep = firstLine.includes('\t') ? '\t' : firstLine.includes(';') ? ';' : ',';
  // Core's CSV reader (RFC 4180, the one reader of whole CSV texts); blank lines are skipped here.
  let records: CsvRecord[];
  try {
    records = readCsvRecords(body, sep).map((r) => ({ line: r.line, fields: r.fields.map((f) => f.trim()) })).filter((r) => r.fields.some((f) => f !== ''));
  } catch (e) {
    if (e instanceof CsvSyntaxError) throw new TableCsvError(e.line, `${e.reason}.`);
    throw e;
  }
  const head = records[0].fields;
  const firstIndex = records[0].line - 1;
  const isHeader = head.some((c) => c !== '' && parseDecimal(c) === undefined);
  let stageCol = 0;
  let dischargeCol = 1;
  let stageUnit: 'm' | 'ft' = siteUnits === 'us' ? 'ft' : 'm';
  let dischargeUnit: 'm³/s' | 'ft³/s' = siteUnits === 'us' ? 'ft³/s' : 'm³/s';
  if (isHeader) {
    const names = head.map((c) => c.toLowerCase());
    const s = names.findIndex((n) => /stage|gauge|gage|height|^h\b|level/.test(n));
    const q = names.findIndex((n) => /discharge|flow|^q\b/.test(n));
    if (head.length < 2) throw new TableCsvError(firstIndex + 1, 'the header names one column; a table needs a stage column and a discharge column.');
    if (s >= 0) stageCol = s;
    if (q >= 0) dischargeCol = q;
    if (stageCol === dischargeCol) throw new TableCsvError(firstIndex + 1, 'the header does not name a separate stage and discharge column.');
    stageUnit = stageUnitOf(head[stageCol]) ?? stageUnit;
    dischargeUnit = dischargeUnitOf(head[dischargeCol]) ?? dischargeUnit;
  }
  const rows: TableRow[] = [];
  const need = Math.max(stageCol, dischargeCol) + 1;
  for (const { line, fields: c } of isHeader ? records.slice(1) : records) {
    const i = line - 1;
    if (c.length < need || c[stageCol] === '' || c[dischargeCol] === '') {
      throw new TableCsvError(i + 1, `a stage and a discharge are needed; this line has ${c.filter((x) => x !== '').length} value${c.filter((x) => x !== '').length === 1 ? '' : 's'}.`);
    }
    const h = parseDecimal(c[stageCol]);
    const q = parseDecimal(c[dischargeCol]);
    if (h === undefined) throw new TableCsvError(i + 1, `the stage “${c[stageCol]}” is not a number.`);
    if (q === undefined) throw new TableCsvError(i + 1, `the discharge “${c[dischargeCol]}” is not a number.`);
    if (q < 0) throw new TableCsvError(i + 1, `the discharge ${q} is below 0.`);
    const stage_m = stageUnit === 'ft' ? h * M_PER_FT : h;
    const discharge_m3s = dischargeUnit === 'ft³/s' ? q * M3S_PER_CFS : q;
    const prev = rows[rows.length - 1];
    if (prev && !(stage_m > prev.stage_m)) throw new TableCsvError(i + 1, `the stage ${h} is not above the line before; list the table from the lowest stage up.`);
    if (prev && prev.discharge_m3s > 0 && !(discharge_m3s > prev.discharge_m3s)) {
      throw new TableCsvError(i + 1, `the discharge ${q} does not rise above the line before.`);
    }
    rows.push({ stage_m, discharge_m3s });
  }
  if (rows.length < 3) throw new TableCsvError(records.length > 0 ? records[records.length - 1].line : 1, `a table needs at least 3 lines of stage and discharge; this one has ${rows.length}.`);
  return { rows, stageUnit, dischargeUnit };
}
