// Import a water-level logger file (#/data/logger/<siteId>): pick the site and the file, say how to read it (with the first rows
// shown as stored), read it in a worker with a progress bar and a stop button, review what was found and
// the drift correction from the check readings, then store it as day records in one transaction.
import { useEffect, useMemo, useRef, useState } from 'preact/hooks';
import { driftCorrections, loggerValueAt, type SiteRecord } from '../../../core';
import { importLoggerRecord, listReadings, listSites, StorageError, type LoggerImportResult } from '../../db';
import type { ScreenProps } from '../../router';
import { useRecords } from '../../components/use-records';
import { Field } from '../../components/Field';
import { guessLoggerMapping } from '../../logger/guess-mapping';
import { readInWorker, type WorkerRead } from '../../logger/parse-in-worker';
import { previewLogger, type LoggerFileRead } from '../../logger/read-logger';
import { href } from '../../router';
import { mappingOf, MappingStep, standardOffsetOf, type MappingDraft } from './mapping-step';
import { ReviewStep, type CheckChoice } from './review-step';
import './style.css';
import { plainError } from '../../plain-words';

const HEAD_BYTES = 64 * 1024;
const HOUR_MS = 3_600_000;
/** Checks this close before the first or after the last value still belong to the record's period. */
const CHECK_MARGIN_MS = 2 * HOUR_MS;

type Phase =
  | { step: 'pick' }
  | { step: 'map'; rows: string[][] }
  | { step: 'reading'; rows: string[][]; fraction: number }
  | { step: 'review'; rows: string[][]; read: LoggerFileRead; checks: CheckChoice[] }
  | { step: 'storing'; rows: string[][]; read: LoggerFileRead; checks: CheckChoice[]; fraction: number }
  | { step: 'done'; result: LoggerImportResult };

/** Check readings (and plain gauge readings the file can be compared with) in the record's period. */
async function checksFor(site: SiteRecord, read: LoggerFileRead): Promise<CheckChoice[]> {
  const { time_ms, level_m } = read.series;
  if (time_ms.length === 0) return [];
  const readings = await listReadings(site.id, time_ms[0] - CHECK_MARGIN_MS, time_ms[time_ms.length - 1] + CHECK_MARGIN_MS);
  const out: CheckChoice[] = [];
  for (const r of readings) {
    if (r.source === 'logger') continue;
    if (r.loggerCheck) {
      out.push({ time_ms: r.time_ms, staff_m: r.stage_m, logger_m: r.loggerCheck.logger_m, readingId: r.id, loggerFrom: 'typed', use: true });
      continue;
    }
    const fromFile = loggerValueAt(time_ms, level_m, r.time_ms, HOUR_MS);
    if (fromFile !== undefined) out.push({ time_ms: r.time_ms, staff_m: r.stage_m, logger_m: fromFile, readingId: r.id, loggerFrom: 'file', use: false });
  }
  // One check per time: a marked check wins over a plain reading at the same time, else the first one.
  const byTime = new Map<number, CheckChoice>();
  for (const c of out) {
    const had = byTime.get(c.time_ms);
    if (!had || (had.loggerFrom === 'file' && c.loggerFrom === 'typed')) byTime.set(c.time_ms, c);
  }
  return [...byTime.values()];
}

function Importer({ sites, initialSiteId }: { sites: SiteRecord[]; initialSiteId?: string }) {
  const [siteId, setSiteId] = useState(initialSiteId && sites.some((s) => s.id === initialSiteId) ? initialSiteId : sites[0].id);
  const site = sites.find((s) => s.id === siteId) ?? sites[0];
  const [file, setFile] = useState<File>();
  const [draft, setDraft] = useState<MappingDraft>();
  const [phase, setPhase] = useState<Phase>({ step: 'pick' });
  const [error, setError] = useState<string>();
  const [leaveOut, setLeaveOut] = useState(false);
  const running = useRef<WorkerRead | undefined>(undefined);
  const storing = useRef<AbortController | undefined>(undefined);
  useEffect(() => () => {
    running.current?.cancel();
    storing.current?.abort();
  }, []);

  async function pickFile(f: File | undefined) {
    setError(undefined);
    setFile(f);
    setLeaveOut(false);
    if (!f) return setPhase({ step: 'pick' });
    try {
      const head = await f.slice(0, HEAD_BYTES).text();
      const { rows, delimiter } = previewLogger(head, 30);
      // The last preview line may be cut by the 64 KiB slice; it is only shown, never stored.
      const guess = guessLoggerMapping(rows, delimiter);
      setDraft({ base: guess.mapping, askDateOrder: guess.bothDateOrders, clock: '', standardOffset_min: standardOffsetOf(site.timeZone, new Date().getUTCFullYear()) });
      setPhase({ step: 'map', rows });
    } catch (err) {
      setError(`The file could not be opened: ${plainError(err, { fallback: 'it is not a text file of rows this import can read.' })}`);
    }
  }

  async function readAll() {
    if (!file || !draft || phase.step !== 'map') return;
    const mapping = mappingOf(draft, site);
    if (!mapping) return setError('Choose the clock of the logger’s times first.');
    setError(undefined);
    const rows = phase.rows;
    setPhase({ step: 'reading', rows, fraction: 0 });
    const work = readInWorker(file, mapping, (fraction) => setPhase((p) => (p.step === 'reading' ? { ...p, fraction } : p)));
    running.current = work;
    try {
      const read = await work.result;
      const checks = await checksFor(site, read);
      setPhase({ step: 'review', rows, read, checks });
    } catch (err) {
      const stopped = err instanceof DOMException && err.name === 'AbortError';
      setError(stopped ? 'Stopped: the file was not read and nothing was stored.' : plainError(err, { fallback: 'The file could not be read.' }));
      setPhase({ step: 'map', rows });
    } finally {
      running.current = undefined;
    }
  }

  async function apply() {
    if (phase.step !== 'review' || !file) return;
    const { read, checks, rows } = phase;
    if (read.rows.problemCount > 0 && !leaveOut) return setError('Some lines could not be read: tick “Leave out those lines” to store the rest, or fix the mapping.');
    const used = checks.filter((c) => c.use).map(({ time_ms, staff_m, logger_m, readingId }) => ({ time_ms, staff_m, logger_m, ...(readingId && { readingId }) }));
    const ac = new AbortController();
    storing.current = ac;
    setError(undefined);
    setPhase({ step: 'storing', rows, read, checks, fraction: 0 });
    try {
      const result = await importLoggerRecord(
        { siteId: site.id, fileName: file.name, time_ms: read.series.time_ms, raw_m: read.series.level_m, correction_m: driftCorrections(used, read.series.time_ms), checks: used },
        { signal: ac.signal, onProgress: (p) => setPhase((x) => (x.step === 'storing' ? { ...x, fraction: p.total ? p.written / p.total : 1 } : x)) },
      );
      setPhase({ step: 'done', result });
    } catch (err) {
      setError(err instanceof StorageError || err instanceof RangeError ? plainError(err, { doing: 'save', timeZone: site.timeZone }) : `Not stored: ${plainError(err, { doing: 'save' })}`);
      setPhase({ step: 'review', rows, read, checks });
    } finally {
      storing.current = undefined;
    }
  }

  // One object per mapping, so the review's figures are not recomputed on every progress step.
  const mapping = useMemo(() => draft && mappingOf(draft, site), [draft, site]);
  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>Import a logger file</h2>
      <section class="card" aria-labelledby="file-heading">
        <h3 id="file-heading">Site and file</h3>
        <Field id="logger-site" label="Site">
          <select id="logger-site" value={site.id} disabled={phase.step === 'reading' || phase.step === 'storing'} onChange={(e) => setSiteId(e.currentTarget.value)}>
            {sites.map((s) => <option key={s.id} value={s.id}>{s.code} · {s.name}</option>)}
          </select>
        </Field>
        <Field id="logger-file" label="Logger file (CSV or text)">
          <input id="logger-file" type="file" accept=".csv,.txt,.dat,.tsv,text/csv,text/plain" disabled={phase.step === 'reading' || phase.step === 'storing'}
            onChange={(e) => void pickFile(e.currentTarget.files?.[0])} />
        </Field>
        {file && <p class="muted">{file.name}, {(file.size / 1024 / 1024).toFixed(1)} MB</p>}
      </section>
      {error && <p class="callout bad" role="alert">{error}</p>}
      {draft && (phase.step === 'map' || phase.step === 'reading') && (
        <MappingStep site={site} rows={phase.rows} draft={draft} onChange={setDraft} />
      )}
      {phase.step === 'map' && (
        <button type="button" class="primary wide" disabled={!mapping} onClick={() => void readAll()}>Read the whole file</button>
      )}
      {phase.step === 'reading' && (
        <section class="card" aria-labelledby="reading-heading">
          <h3 id="reading-heading">Reading the file…</h3>
          <progress class="wide" data-testid="read-progress" max={1} value={phase.fraction} aria-label="Part of the file read" />
          <p class="muted" role="status">{Math.round(phase.fraction * 100)} % read</p>
          <button type="button" class="wide" onClick={() => running.current?.cancel()}>Stop reading</button>
        </section>
      )}
      {(phase.step === 'review' || phase.step === 'storing') && mapping && (
        <>
          <ReviewStep site={site} read={phase.read} mapping={mapping} checks={phase.checks}
            onToggle={(i, use) => setPhase((p) => (p.step === 'review' ? { ...p, checks: p.checks.map((c, k) => (k === i ? { ...c, use } : c)) } : p))} />
          <section class="card" aria-labelledby="apply-heading">
            <h3 id="apply-heading">Store the record</h3>
            <p class="hint">Corrected values are estimates from the checks you took; they defer to the station’s approved procedures. A time already on the phone is not stored twice.</p>
            {phase.read.rows.problemCount > 0 && (
              <label class="check">
                <input type="checkbox" checked={leaveOut} disabled={phase.step === 'storing'} onChange={(e) => setLeaveOut(e.currentTarget.checked)} />
                Leave out those {phase.read.rows.problemCount} line{phase.read.rows.problemCount === 1 ? '' : 's'} that could not be read
              </label>
            )}
            {phase.step === 'review' && (
              <div class="row">
                <button type="button" class="primary" disabled={phase.read.series.time_ms.length === 0} onClick={() => void apply()}>
                  Store {phase.read.series.time_ms.length.toLocaleString('en-GB')} values
                </button>
                <button type="button" onClick={() => setPhase({ step: 'map', rows: phase.rows })}>Change the mapping</button>
              </div>
            )}
            {phase.step === 'storing' && (
              <>
                <progress class="wide" data-testid="store-progress" max={1} value={phase.fraction} aria-label="Part of the record stored" />
                <button type="button" class="wide" onClick={() => storing.current?.abort()}>Stop storing</button>
              </>
            )}
          </section>
        </>
      )}
      {phase.step === 'done' && (
        <section class="card" aria-labelledby="done-heading">
          <h3 id="done-heading">Stored</h3>
          <p class="callout ok" role="status" data-testid="import-done">
            Stored {phase.result.stored.toLocaleString('en-GB')} values in {phase.result.days.toLocaleString('en-GB')} day record{phase.result.days === 1 ? '' : 's'}.
            {phase.result.duplicates.length > 0 && ` ${phase.result.duplicates.length.toLocaleString('en-GB')} values were already on the phone at the same times and were not stored twice.`}
          </p>
          <p><a href={href('sites', site.id)}>Readings of this site</a> · <a href={href('storm', site.id)}>Storm runoff</a></p>
          <button type="button" class="wide" onClick={() => void pickFile(undefined)}>Import another file</button>
        </section>
      )}
    </>
  );
}

/** The logger import screen; #/logger/<siteId> starts at that site. */
export default function LoggerImport({ params }: ScreenProps) {
  const sites = useRecords(() => listSites(), ['site'], []);
  if (sites.state === 'loading') return <p aria-busy="true">Reading the sites…</p>;
  if (sites.state === 'failed') return <p class="callout bad" role="alert">{sites.message}</p>;
  if (sites.value.length === 0) {
    return (
      <>
        <h2 id="screen-title" tabIndex={-1}>Import a logger file</h2>
        <p>There is no site on this phone yet. <a href={href('sites')}>Add a site</a> first.</p>
      </>
    );
  }
  return <Importer sites={sites.value} initialSiteId={params.siteId} />;
}
