// Import stage readings from a CSV file into one site: pick the file, confirm which column is what
// (a first guess is made from the file), see the first rows as they will be stored, then import them
// all in one transaction. A file with any bad line imports nothing and lists the lines.
import { useMemo, useState } from 'preact/hooks';
import {
  CsvImportError, guessReadingsMapping, parseReadingsCsv, readCsvRecords, READING_SOURCES,
  type CsvProblem, type ReadingBody, type ReadingCsvMapping, type ReadingSource, type SiteRecord,
} from '../../../core';
import { importReadings } from '../../db';
import { Field } from '../../components/Field';
import { formatQuantity, formatTime } from '../../format';

/** Largest file this import reads on the page, bytes (a bigger one would hold the page up while parsing). */
const MAX_FILE_BYTES = 5 * 1024 * 1024;
const SOURCE_LABELS: Record<ReadingSource, string> = { staff: 'Staff gauge', 'wire-weight': 'Wire-weight gauge', 'crest-stage': 'Crest-stage gauge', logger: 'Logger' };
const SEPARATORS = { ',': 'Comma', ';': 'Semicolon', '\t': 'Tab' } as const;

type Draft = ReturnType<typeof guessReadingsMapping>['mapping'];
type Checked = { readings: ReadingBody[] } | { problems: CsvProblem[] } | { missing: string };

function check(text: string, m: Draft, siteId: string): Checked {
  if (m.time === undefined) return { missing: 'Choose the column that holds the time.' };
  if (m.stage === undefined) return { missing: 'Choose the column that holds the stage.' };
  if (m.time === m.stage) return { missing: 'The time and the stage must be different columns.' };
  try {
    return { readings: parseReadingsCsv(text, { ...m, time: m.time, stage: m.stage } as ReadingCsvMapping, siteId) };
  } catch (e) {
    if (e instanceof CsvImportError) return { problems: e.problems };
    throw e;
  }
}

/** The CSV import card for the given sites. */
export function CsvImportSection({ sites }: { sites: SiteRecord[] }) {
  const [siteId, setSiteId] = useState(sites[0]?.id ?? '');
  const site = sites.find((s) => s.id === siteId) ?? sites[0];
  const [file, setFile] = useState<{ name: string; text: string }>();
  const [mapping, setMapping] = useState<Draft>();
  const [status, setStatus] = useState<{ ok: boolean; text: string }>();
  const [progress, setProgress] = useState<number>();
  const columns = useMemo(() => {
    if (!file || !mapping) return [];
    const head = file.text.split(/\r\n|\n|\r/, 40).join('\n');
    let recs: { line: number; fields: string[] }[] = [];
    try {
      recs = readCsvRecords(head, mapping.delimiter);
    } catch {
      recs = readCsvRecords(head.split('\n')[0] ?? '', mapping.delimiter);
    }
    const header = recs.find((r) => r.line === mapping.headerLine);
    const width = Math.max(0, ...recs.map((r) => r.fields.length));
    return Array.from({ length: width }, (_, i) => (header?.fields[i]?.trim() ? `${i + 1}: ${header.fields[i].trim()}` : `column ${i + 1}`));
  }, [file, mapping?.delimiter, mapping?.headerLine]);
  const checked = useMemo(() => (file && mapping && site ? check(file.text, mapping, site.id) : undefined), [file, mapping, site?.id]);
  if (!site) return null;

  async function pick(input: HTMLInputElement) {
    setStatus(undefined);
    const f = input.files?.[0];
    if (!f) return;
    if (f.size > MAX_FILE_BYTES) {
      setFile(undefined);
      setStatus({ ok: false, text: `${f.name} is ${(f.size / 1024 / 1024).toFixed(1)} MiB; this import takes files up to 5 MiB. Split it into smaller files.` });
      return;
    }
    const text = await f.text();
    setFile({ name: f.name, text });
    setMapping(guessReadingsMapping(text).mapping);
  }

  async function run() {
    if (!checked || !('readings' in checked) || checked.readings.length === 0) return;
    setStatus(undefined);
    setProgress(0);
    try {
      const r = await importReadings(checked.readings, { onProgress: (p) => setProgress(p.total ? p.written / p.total : 1) });
      setStatus({ ok: true, text: `Imported ${r.imported} readings into ${site.code}.${r.duplicates.length > 0 ? ` ${r.duplicates.length} were already there (same time and source) and were not doubled.` : ''}` });
      setFile(undefined);
      setMapping(undefined);
    } catch {
      setStatus({ ok: false, text: 'The readings could not be stored; nothing was imported.' });
    } finally {
      setProgress(undefined);
    }
  }

  const set = (patch: Partial<Draft>) => mapping && setMapping({ ...mapping, ...patch });
  const colSelect = (id: string, label: string, value: number | undefined, onChange: (v: number | undefined) => void, optional: boolean) => (
    <Field id={id} label={label}>
      <select id={id} value={value === undefined ? '' : String(value)} onChange={(e) => onChange(e.currentTarget.value === '' ? undefined : Number(e.currentTarget.value))}>
        {(optional || value === undefined) && <option value="">{optional ? 'none' : 'choose…'}</option>}
        {columns.map((c, i) => <option key={i} value={String(i)}>{c}</option>)}
      </select>
    </Field>
  );

  return (
    <section class="card" aria-labelledby="import-heading">
      <h3 id="import-heading">Import readings from CSV</h3>
      <p class="hint">One reading per line: a time with its UTC offset (e.g. 2026-12-01T10:15:00+13:00) and a stage; a quality and a note if the file has them.</p>
      <Field id="import-site" label="Into site">
        <select id="import-site" value={site.id} onChange={(e) => setSiteId(e.currentTarget.value)}>
          {sites.map((s) => <option key={s.id} value={s.id}>{s.code} · {s.name}</option>)}
        </select>
      </Field>
      <Field id="import-file" label="CSV file">
        <input id="import-file" type="file" accept=".csv,.txt,text/csv,text/plain" onChange={(e) => void pick(e.currentTarget)} />
      </Field>
      {file && mapping && (
        <>
          <div class="row">
            <Field id="import-separator" label="Separator">
              <select id="import-separator" value={mapping.delimiter} onChange={(e) => set({ delimiter: e.currentTarget.value as Draft['delimiter'] })}>
                {(Object.keys(SEPARATORS) as Draft['delimiter'][]).map((d) => <option key={d} value={d}>{SEPARATORS[d]}</option>)}
              </select>
            </Field>
            <Field id="import-header" label="Header on line" hint="0 when there is none">
              <input id="import-header" type="number" inputMode="numeric" min={0} value={mapping.headerLine} onInput={(e) => {
                const n = Number(e.currentTarget.value);
                if (Number.isInteger(n) && n >= 0) set({ headerLine: n });
              }} />
            </Field>
          </div>
          {colSelect('import-time', 'Time column', mapping.time, (v) => set({ time: v }), false)}
          <div class="row">
            {colSelect('import-stage', 'Stage column', mapping.stage, (v) => set({ stage: v }), false)}
            <Field id="import-unit" label="Stage unit">
              <select id="import-unit" value={mapping.stageUnit} onChange={(e) => set({ stageUnit: e.currentTarget.value as Draft['stageUnit'] })}>
                <option value="m">m</option><option value="cm">cm</option><option value="ft">ft</option>
              </select>
            </Field>
          </div>
          <label class="choice"><input type="checkbox" checked={mapping.decimalComma} onChange={(e) => set({ decimalComma: e.currentTarget.checked })} /> Decimal comma (0,734)</label>
          <div class="row">
            {colSelect('import-quality', 'Quality column', mapping.quality, (v) => set({ quality: v }), true)}
            {colSelect('import-note', 'Note column', mapping.note, (v) => set({ note: v }), true)}
          </div>
          <Field id="import-source" label="The readings are from">
            <select id="import-source" value={mapping.source} onChange={(e) => set({ source: e.currentTarget.value as ReadingSource })}>
              {READING_SOURCES.map((s) => <option key={s} value={s}>{SOURCE_LABELS[s]}</option>)}
            </select>
          </Field>
          {checked && 'missing' in checked && <p class="callout bad" role="status">{checked.missing}</p>}
          {checked && 'problems' in checked && (
            <div class="callout bad" role="status">
              <p>Nothing can be imported until these lines are right:</p>
              <ul>{checked.problems.map((p) => <li key={p.line}>Line {p.line}: {p.message}</li>)}</ul>
            </div>
          )}
          {checked && 'readings' in checked && (
            <>
              <p>{checked.readings.length === 0 ? 'The file holds no readings.' : `${checked.readings.length} readings; the first as they will be stored:`}</p>
              {checked.readings.length > 0 && (
                <table>
                  <thead><tr><th scope="col">Time ({site.timeZone})</th><th scope="col">Stage</th><th scope="col">Quality</th><th scope="col">Note</th></tr></thead>
                  <tbody>
                    {checked.readings.slice(0, 5).map((r, i) => (
                      <tr key={i}><td>{formatTime(r.time_ms, site.timeZone)}</td><td>{formatQuantity('stage', r.stage_m, site.displayUnits)}</td><td>{r.quality}</td><td>{r.note}</td></tr>
                    ))}
                  </tbody>
                </table>
              )}
              <button type="button" class="primary wide" disabled={checked.readings.length === 0 || progress !== undefined} onClick={() => void run()}>
                Import {checked.readings.length} readings into {site.code}
              </button>
            </>
          )}
          {progress !== undefined && <progress class="wide" value={progress} max={1} aria-label="Import progress" />}
        </>
      )}
      {status && <p class={status.ok ? 'callout ok' : 'callout bad'} role="status">{status.text}</p>}
    </section>
  );
}
