// A first guess at how a readings CSV file is laid out, from its first lines: the separator, the header
// line, which column is the time, stage, quality and note, the stage unit and the decimal mark. The
// screen shows the guess for the user to confirm or change; nothing here is imported.
import { readCsvRecords } from './csv-read';
import { withoutBom } from './text-file';
import { parseIsoWithOffset, type CsvStageUnit, type ReadingCsvMapping } from './readings-csv-import';

/** The guess: a mapping (with undefined where no column was found) and the first records to preview. */
export interface MappingGuess {
  mapping: Omit<ReadingCsvMapping, 'time' | 'stage'> & { time?: number; stage?: number };
  /** Column names: the header's cells, or "column 1", "column 2", … without a header. */
  columns: string[];
  /** Up to `rows` records after the header, as text, with their line numbers. */
  preview: { line: number; fields: string[] }[];
}

const find = (names: readonly string[], re: RegExp, not?: RegExp) => {
  const i = names.findIndex((n) => re.test(n) && !(not && not.test(n)));
  return i < 0 ? undefined : i;
};

/** Guesses the layout of a readings CSV from its text (only the first lines are read). */
export function guessReadingsMapping(text: string, rows = 5): MappingGuess {
  const head = withoutBom(text).split(/\r\n|\n|\r/, 40);
  const lines = head.filter((l) => l.trim() !== '');
  const first = lines[0] ?? '';
  // The separator found on every one of the first lines, most often; on a tie tab, then ';' (a comma may be a decimal mark).
  const counts = (['\t', ';', ','] as const).map((d) => ({ d, n: lines.length === 0 ? 0 : Math.min(...lines.slice(0, 5).map((l) => l.split(d).length - 1)) }));
  const delimiter = counts.reduce((a, b) => (b.n > a.n ? b : a), { d: ',', n: 0 } as { d: ',' | ';' | '\t'; n: number }).d;
  let records: { line: number; fields: string[] }[];
  try {
    records = readCsvRecords(head.join('\n'), delimiter);
  } catch {
    // A quoted field running past the lines read: guess from the first line alone.
    records = readCsvRecords(first, delimiter);
  }
  records = records.filter((r) => r.fields.some((f) => f.trim() !== ''));
  const top = records[0];
  const hasHeader = top !== undefined && !top.fields.some((f) => typeof parseIsoWithOffset(f) === 'number');
  const width = Math.max(0, ...records.map((r) => r.fields.length));
  const columns = hasHeader ? top.fields.map((f) => f.trim()) : Array.from({ length: width }, (_, i) => `column ${i + 1}`);
  const data = records.slice(hasHeader ? 1 : 0);
  const sample = data[0]?.fields ?? [];
  const lower = columns.map((c) => c.toLowerCase());
  let time = hasHeader ? find(lower, /time|date/) : undefined;
  if (time === undefined) time = sample.findIndex((f) => typeof parseIsoWithOffset(f) === 'number');
  if (time !== undefined && time < 0) time = undefined;
  let stage = hasHeader ? find(lower, /stage|level|gauge|height|^gh|^h\b/, /shift|datum|time/) : undefined;
  if (stage === undefined) {
    const k = sample.findIndex((f, i) => i !== time && /^\s*[+-]?\d+([.,]\d*)?\s*$/.test(f));
    stage = k < 0 ? undefined : k;
  }
  const unitText = stage !== undefined ? lower[stage] ?? '' : '';
  const unit = /(^|[^a-z])cm([^a-z]|$)/.test(unitText) ? 'cm' : /(^|[^a-z])(ft|feet)([^a-z]|$)/.test(unitText) ? 'ft' : 'm';
  const decimalComma = delimiter !== ',' && stage !== undefined && /\d,\d/.test(sample[stage] ?? '');
  return {
    mapping: {
      delimiter,
      headerLine: hasHeader ? top.line : 0,
      time,
      stage,
      stageUnit: unit as CsvStageUnit,
      decimalComma,
      quality: hasHeader ? find(lower, /quality|grade/) : undefined,
      note: hasHeader ? find(lower, /note|comment|remark/) : undefined,
      source: 'staff',
      defaultQuality: 'good',
    },
    columns,
    preview: data.slice(0, rows),
  };
}
