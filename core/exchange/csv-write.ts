// Writing CSV tables for office systems: RFC 4180 fields and records, a UTF-8 byte-order mark, and
// free-text cells kept from being read as spreadsheet formulas (OWASP "CSV Injection"; OWASP ASVS 4.0
// requirement 5.3.6 / 5.0 requirement 1.2.10) while numeric columns stay plain numbers.

/** The byte-order mark every CSV starts with, so spreadsheets read the UTF-8 right (m³/s, names). */
export const CSV_BOM = '\uFEFF';

/** What a column holds: free text (neutralised), a number (checked numeric), or a time (ISO 8601). */
export type CsvColumnKind = 'text' | 'number' | 'time';

/** One column of a table: its header (units in it, e.g. "stage_m") and what it holds. */
export interface CsvColumn {
  name: string;
  kind: CsvColumnKind;
}

// Cells a spreadsheet may take for a formula: one starting with = + - @ (and their full-width forms,
// which some spreadsheets fold), tab, CR (OWASP), or NUL (ASVS). Leading spaces are looked past,
// because some spreadsheets trim them before deciding.
const FORMULA_START = /^[ ]*[=+\-@\t\r\0\uFF1D\uFF0B\uFF0D\uFF20]/;
const NUMBER = /^-?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(?::\d{2}(?:\.\d+)?)?(?:Z|[+-]\d{2}:\d{2})$/;

/** Quotes one field as RFC 4180 §2 rules 5–7 ask: only when it holds a comma, quote, CR or LF. */
export function csvField(value: string): string {
  return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/** True when a spreadsheet could read this text as a formula. */
export function looksLikeFormula(text: string): boolean {
  return FORMULA_START.test(text);
}

/**
 * A free-text cell made safe for spreadsheets: text that could start a formula gets a leading
 * apostrophe (which spreadsheets read as "this is text") and is always quoted (OWASP's advice).
 * Returns the field as it goes into the file.
 */
export function textField(text: string): string {
  if (!looksLikeFormula(text)) return csvField(text);
  return `"'${text.replace(/"/g, '""')}"`;
}

/** Joins rows of already-safe string fields into an RFC 4180 document (CRLF after every record). */
export function csvDocument(rows: readonly (readonly string[])[]): string {
  return rows.map((r) => r.map(csvField).join(',') + '\r\n').join('');
}

/**
 * A whole CSV table: byte-order mark, header row, then one record per row, CRLF line ends. Text cells
 * are neutralised; number cells must be plain decimal numbers (or empty for "no value") and time cells
 * ISO 8601 with an offset, else a RangeError names the row and column (a wrong cell is a bug, never
 * written). Rows hold one string per column, in column order.
 */
export function csvTable(columns: readonly CsvColumn[], rows: readonly (readonly string[])[]): string {
  const out: string[] = [CSV_BOM + columns.map((c) => textField(c.name)).join(',') + '\r\n'];
  for (let r = 0; r < rows.length; r++) {
    const row = rows[r];
    if (row.length !== columns.length) {
      throw new RangeError(`csvTable: row ${r + 1} has ${row.length} cells; the table has ${columns.length} columns`);
    }
    const cells: string[] = new Array(row.length);
    for (let c = 0; c < row.length; c++) {
      const v = row[c];
      const kind = columns[c].kind;
      if (kind === 'text') cells[c] = textField(v);
      else if (v === '' || (kind === 'number' ? NUMBER.test(v) : TIME.test(v))) cells[c] = v;
      else throw new RangeError(`csvTable: row ${r + 1}, column ${columns[c].name} should hold a ${kind === 'number' ? 'plain number' : 'time with offset'}; got ${JSON.stringify(v)}`);
    }
    out.push(cells.join(',') + '\r\n');
  }
  return out.join('');
}

/** A number for a CSV cell: finite values to at most `digits` significant digits, no exponent below 1e21; '' when absent. */
export function csvNumber(value: number | null | undefined, digits = 9): string {
  if (value === null || value === undefined) return '';
  if (!Number.isFinite(value)) throw new RangeError(`csvNumber needs a finite number; got ${String(value)}`);
  const v = Number(value.toPrecision(digits));
  // Very small magnitudes print as 1e-7 in JavaScript; spreadsheets read that, but keep it decimal.
  return Math.abs(v) < 1e-6 && v !== 0 ? v.toFixed(12).replace(/0+$/, '') : String(v);
}
