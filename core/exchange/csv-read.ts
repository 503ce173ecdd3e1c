// Reading CSV text into records of fields (RFC 4180, with ',' ';' or tab between fields), keeping the
// line each record starts on so that an import can name the line of every problem.
import { withoutBom } from './text-file';

/** One record of a CSV file: its fields and the 1-based line it starts on. */
export interface CsvRecord {
  line: number;
  fields: string[];
}

/** A CSV file that cannot be read as records: the line of the problem and a sentence about it. */
export class CsvSyntaxError extends RangeError {
  constructor(
    readonly line: number,
    /** The sentence about the problem, without its line. */
    readonly reason: string,
  ) {
    super(`Line ${line}: ${reason}`);
    this.name = 'CsvSyntaxError';
  }
}

/**
 * The records of CSV text: a leading byte-order mark is skipped; CRLF, LF or CR end a record outside
 * quotes; a quoted field may hold the delimiter, line breaks and doubled quotes (RFC 4180 §2 rules 5–7).
 * A final line break does not make an empty record. Throws a CsvSyntaxError for a quote left open or
 * text after a closing quote.
 */
export function readCsvRecords(text: string, delimiter: ',' | ';' | '\t' = ','): CsvRecord[] {
  const s = withoutBom(text);
  const records: CsvRecord[] = [];
  let line = 1;
  let start = 1;
  let fields: string[] = [];
  let i = 0;
  const n = s.length;
  const endRecord = () => {
    records.push({ line: start, fields });
    fields = [];
  };
  if (n === 0) return records;
  for (;;) {
    // At the start of a field.
    if (s[i] === '"') {
      const open = line;
      let value = '';
      i++;
      for (;;) {
        const q = s.indexOf('"', i);
        if (q < 0) throw new CsvSyntaxError(open, 'a quoted field is never closed (a " is missing)');
        const part = s.slice(i, q);
        for (let k = 0; k < part.length; k++) if (part[k] === '\n' || (part[k] === '\r' && part[k + 1] !== '\n')) line++;
        value += part;
        if (s[q + 1] === '"') {
          value += '"';
          i = q + 2;
          continue;
        }
        i = q + 1;
        break;
      }
      fields.push(value);
      if (i < n && s[i] !== delimiter && s[i] !== '\n' && s[i] !== '\r') {
        throw new CsvSyntaxError(line, 'there is text after the closing quote of a field; put the whole field in quotes and double any " inside it');
      }
    } else {
      let j = i;
      while (j < n && s[j] !== delimiter && s[j] !== '\n' && s[j] !== '\r') j++;
      fields.push(s.slice(i, j));
      i = j;
    }
    if (i >= n) {
      endRecord();
      return records;
    }
    if (s[i] === delimiter) {
      i++;
      continue;
    }
    // A line break ends the record.
    i += s[i] === '\r' && s[i + 1] === '\n' ? 2 : 1;
    line++;
    endRecord();
    start = line;
    if (i >= n) return records;
  }
}
