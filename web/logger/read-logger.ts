// Streams a logger file through papaparse (the CSV splitting) into core's logger reader (the meaning of
// each cell): the same code runs in the import worker on a File and in Node tests on a string.
// Line numbers count papaparse's rows, which are the file's lines unless a quoted field spans lines.
import Papa from 'papaparse';
import { loggerReader, tidyLoggerRows, type LoggerMapping, type LoggerRows, type LoggerSeries } from '../../core';

/** Characters handed to the reader per chunk unless told otherwise (a 50 MB file is read in ~50 steps). */
export const LOGGER_CHUNK_CHARS = 1 << 20;

/** What reading a logger file gives: every row as read (with problems) and the tidy series to store. */
export interface LoggerFileRead {
  rows: Omit<LoggerRows, 'time_ms' | 'level_m' | 'line'>;
  series: LoggerSeries;
}

/** Options: chunk size in characters, progress as a fraction 0–1 of the input read, a stop signal. */
export interface ReadLoggerOptions {
  chunkChars?: number;
  onProgress?: (fraction: number) => void;
  signal?: AbortSignal;
}

/** Reads a whole logger file (text or a File/Blob) under the mapping; rejects with an AbortError when stopped. */
export function readLoggerFile(input: string | Blob, mapping: LoggerMapping, options: ReadLoggerOptions = {}): Promise<LoggerFileRead> {
  const size = typeof input === 'string' ? input.length : input.size;
  let line = 0;
  let lastBlank = false;
  return new Promise((resolve, reject) => {
    const reader = loggerReader(mapping); // a RangeError here (an incomplete mapping) rejects the promise
    const config: Papa.ParseLocalConfig<string[], File> = {
      delimiter: mapping.delimiter,
      header: false,
      skipEmptyLines: false,
      dynamicTyping: false,
      chunkSize: options.chunkChars ?? LOGGER_CHUNK_CHARS,
      chunk(results: Papa.ParseResult<string[]>, parser: Papa.Parser) {
        if (options.signal?.aborted) {
          parser.abort();
          return;
        }
        for (const cells of results.data) {
          line++;
          lastBlank = cells.length === 0 || (cells.length === 1 && cells[0] === '');
          reader.push(cells, line);
        }
        options.onProgress?.(size > 0 ? Math.min(1, results.meta.cursor / size) : 1);
      },
      complete() {
        if (options.signal?.aborted) {
          reject(new DOMException('The file was not read: stopped.', 'AbortError'));
          return;
        }
        // papaparse gives a last empty row when the file ends with a line break.
        const read = reader.finish(lastBlank);
        const { time_ms, level_m, line: lines, ...rest } = read;
        resolve({ rows: rest, series: tidyLoggerRows({ time_ms, level_m, line: lines }) });
      },
      error(err: Error) {
        reject(new RangeError(`The file could not be read: ${err.message}`));
      },
    };
    // papaparse streams a string in chunks just as it streams a file; its types only describe the latter.
    if (typeof input === 'string') (Papa.parse as (text: string, c: Papa.ParseLocalConfig<string[], File>) => void)(input, config);
    else Papa.parse(input as File, config);
  });
}

/** The first `lines` lines of a file's text split into fields (for the mapping step), and the separator found. */
export function previewLogger(text: string, lines = 20, delimiter?: string): { rows: string[][]; delimiter: string } {
  // The guess skips blank lines (they would spoil papaparse's field-count average) and tries the
  // semicolon first: with decimal commas a comma would split every number in two.
  const found = delimiter ?? Papa.parse<string[]>(text, { preview: Math.max(lines, 10), skipEmptyLines: 'greedy', delimitersToGuess: [';', '\t', ','] }).meta.delimiter;
  const r = Papa.parse<string[]>(text, { preview: lines, header: false, skipEmptyLines: false, delimiter: found });
  return { rows: r.data, delimiter: found };
}
