// One site's storm analysis: the readings window, key points, method, rainfall, results, plot and save.
import { useMemo, useReducer, useState } from 'preact/hooks';
import {
  displayUnit,
  fromDisplay,
  fromLocalInput,
  toDisplay,
  toLocalInput,
  type AnalysisResults,
  type EventPoints,
  type EventSummary,
  type SiteRecord,
} from '../../../core';
import { EventFigures } from '../../components/EventFigures';
import { Hydrograph, type PlotLine, type PlotMarker } from '../../components/Hydrograph';
import { KeyPointFields, type InflectionCrossCheck } from '../../components/KeyPointFields';
import { SeparationPicker } from '../../components/SeparationPicker';
import { latestReading, saveAnalysis, seriesWithDischarge } from '../../db';
import { formatQuantity, formatTime, parseDecimal } from '../../format';
import { analyse, findPoints, polynomialInflection, seriesFromReadings, usesKeyPoints, type StormSeries } from './analysis';
import { initialDraft, stormReducer, type TimeWindow } from './draft';
import { SavedAnalyses } from './saved-analyses';
import { useRecords } from '../../db/use-records';

const DAY_MS = 86_400_000;
/** The default readings window: this many days up to the latest reading. */
const DEFAULT_WINDOW_DAYS = 14;

function resultsOf(s: EventSummary): AnalysisResults {
  const r: AnalysisResults = {
    peak_m3s: s.peak_m3s,
    peakTime_ms: s.peakTime_ms,
    totalVolume_m3: s.totalVolume_m3,
    baseflowVolume_m3: s.baseflowVolume_m3,
    directVolume_m3: s.directVolume_m3,
    baseflowIndex: s.baseflowIndex,
  };
  if (s.runoffDepth_mm !== undefined) r.runoffDepth_mm = s.runoffDepth_mm;
  if (s.runoffCoefficient !== undefined) r.runoffCoefficient = s.runoffCoefficient;
  return r;
}

type SaveState = { status: 'idle' } | { status: 'saving' } | { status: 'saved'; at_ms: number } | { status: 'failed'; message: string };

/** The part of the plot to show: the event with half its length either side, or the whole window. */
function plotRange(series: StormSeries, points: EventPoints | undefined, whole: boolean): [number, number] {
  const t = series.time_ms;
  if (whole || !points) return [0, t.length];
  const margin = 0.5 * (points.runoffEnd_ms - points.riseStart_ms);
  let a = 0;
  while (a < t.length - 1 && t[a + 1] < points.riseStart_ms - margin) a++;
  let b = t.length;
  while (b > a + 2 && t[b - 2] > points.runoffEnd_ms + margin) b--;
  return [a, b];
}

/** The storm screen for one site (the parent keys it by site id, so a new site starts a fresh draft). */
export function SiteStorm({ site }: { site: SiteRecord }) {
  const [draft, dispatch] = useReducer(stormReducer, initialDraft);
  const [windowProblem, setWindowProblem] = useState<string>();
  const [logScale, setLogScale] = useState(false);
  const [wholeWindow, setWholeWindow] = useState(false);
  const [save, setSave] = useState<SaveState>({ status: 'idle' });
  const zone = site.timeZone;
  const units = site.displayUnits;
  const area = site.area_km2;
  const latest = useRecords(() => latestReading(site.id), ['reading'], [site.id]);
  const defaultWindow: TimeWindow | undefined =
    latest.state === 'ready' && latest.value
      ? { from_ms: latest.value.time_ms - DEFAULT_WINDOW_DAYS * DAY_MS, to_ms: latest.value.time_ms }
      : undefined;
  const win = draft.window ?? defaultWindow;
  // The compact series (times, stages, sources) with discharges: all the storm needs, read fast.
  const rows = useRecords(
    async () => (win ? seriesWithDischarge(site.id, win.from_ms, win.to_ms) : undefined),
    ['reading', 'rating'],
    [site.id, win?.from_ms, win?.to_ms],
  );

  const made = useMemo(() => (rows.state === 'ready' && rows.value ? seriesFromReadings(rows.value) : undefined), [rows]);
  const series = made?.kind === 'ready' ? made.series : undefined;
  const found = useMemo(() => (series ? findPoints(series, area) : undefined), [series, area]);
  const foundPoints = found?.ok ? found.value.points : undefined;
  const points = draft.points ?? foundPoints;
  const crossCheck = useMemo<InflectionCrossCheck | undefined>(() => {
    if (!series || !points) return undefined;
    const r = polynomialInflection(series, points);
    return r.ok ? { time_ms: r.value } : { message: r.message };
  }, [series, points]);

  const rain = useMemo((): { mm?: number; problem?: string } => {
    if (draft.rainfall.trim() === '') return {};
    const v = parseDecimal(draft.rainfall);
    if (v === undefined || !(v > 0)) return { problem: `Rainfall needs a number above 0 in ${displayUnit('depth', units)}.` };
    return { mm: fromDisplay('depth', v, units) };
  }, [draft.rainfall, units]);
  // Without an area there is no runoff depth, so the coefficient is not asked of the core.
  const rainfall_mm = area === undefined ? undefined : rain.mm;

  const result = useMemo(
    () => (series && points ? analyse(series, points, draft.method, area, rainfall_mm) : undefined),
    [series, points, draft.method, area, rainfall_mm],
  );

  const plot = useMemo(() => {
    if (!series) return undefined;
    const [a, b] = plotRange(series, points, wholeWindow);
    const q = series.discharge_m3s.subarray(a, b);
    const lines: PlotLine[] = [{ label: 'Discharge', values: Array.from(q, (v) => toDisplay('discharge', v, units)) }];
    if (result?.ok) {
      const base = result.value.baseflow_m3s.subarray(a, b);
      lines.push({ label: 'Baseflow', values: Array.from(base, (v) => toDisplay('discharge', v, units)), dash: [6, 4] });
    }
    return { time_ms: series.time_ms.subarray(a, b), lines };
  }, [series, points, wholeWindow, result, units]);
  const markers = useMemo<PlotMarker[] | undefined>(
    () =>
      points && [
        { time_ms: points.riseStart_ms, label: 'R' },
        { time_ms: points.peak_ms, label: 'P' },
        { time_ms: points.inflection_ms, label: 'I' },
        { time_ms: points.runoffEnd_ms, label: 'E' },
      ],
    [points],
  );

  const setWindow = (which: keyof TimeWindow, text: string) => {
    if (!win) return;
    let time_ms: number;
    try {
      time_ms = fromLocalInput(text, zone);
    } catch (e) {
      if (e instanceof RangeError) return; // half-typed: wait for a whole time
      throw e;
    }
    const next = { ...win, [which]: time_ms };
    if (!(next.to_ms > next.from_ms)) {
      setWindowProblem('The window must end after it starts.');
      return;
    }
    setWindowProblem(undefined);
    setSave({ status: 'idle' });
    dispatch({ type: 'window', window: next });
  };

  const saveNow = async () => {
    if (!win || !points || !result?.ok) return;
    setSave({ status: 'saving' });
    try {
      await saveAnalysis({
        siteId: site.id,
        from_ms: win.from_ms,
        to_ms: win.to_ms,
        method: { ...result.value.method },
        points,
        ...(area === undefined ? {} : { area_km2: area }),
        ...(rainfall_mm === undefined ? {} : { rainfall_mm }),
        results: resultsOf(result.value.summary),
        note: draft.note.trim(),
      });
      setSave({ status: 'saved', at_ms: Date.now() });
      dispatch({ type: 'saved' });
    } catch (e) {
      setSave({ status: 'failed', message: e instanceof Error ? e.message : String(e) });
    }
  };

  const depthUnit = displayUnit('depth', units);
  const notes = [
    ...(made?.kind === 'ready' && made.skipped > 0
      ? [`${made.skipped} manual reading${made.skipped === 1 ? '' : 's'} at the same time as a logger reading ${made.skipped === 1 ? 'was' : 'were'} left out: the logger record is used.`]
      : []),
    ...(draft.points === undefined && found?.ok ? found.value.notes : []),
    ...(result?.ok ? result.value.notes : []),
  ];

  return (
    <div class="storm">
      <fieldset>
        <legend>Readings window ({zone})</legend>
        {latest.state === 'loading' && <p class="muted">Reading the site's records…</p>}
        {latest.state === 'failed' && <p class="callout bad">{latest.message}</p>}
        {latest.state === 'ready' && !latest.value && (
          <p class="callout" data-testid="storm-no-readings">
            There are no readings at this site yet. <a href="#/record">Record a reading</a> or import the logger first.
          </p>
        )}
        {win && (
          <div class="storm-window">
            <div>
              <label for="storm-from">From</label>
              <input id="storm-from" type="datetime-local" value={toLocalInput(win.from_ms, zone)} onChange={(e) => setWindow('from_ms', e.currentTarget.value)} />
            </div>
            <div>
              <label for="storm-to">To</label>
              <input id="storm-to" type="datetime-local" value={toLocalInput(win.to_ms, zone)} onChange={(e) => setWindow('to_ms', e.currentTarget.value)} />
            </div>
          </div>
        )}
        {windowProblem && <p class="callout warn" role="alert">{windowProblem}</p>}
        {made?.kind === 'ready' && (
          <p class="hint">{series?.time_ms.length} readings with discharge in this window.</p>
        )}
      </fieldset>

      {rows.state === 'failed' && <p class="callout bad">{rows.message}</p>}
      {win && made?.kind === 'empty' && <p class="callout">There are no readings in this window. Move the window to a time with readings.</p>}
      {made?.kind === 'unrated' && (
        <p class="callout warn" data-testid="storm-unrated">
          {made.count} of the {made.total} readings in this window have no rating in force (the first at{' '}
          {formatTime(made.firstTime_ms, zone)}), so they have no discharge and the storm cannot be worked out. Enter
          or fit a rating for this site valid from before the window, or start the window later.
        </p>
      )}
      {made?.kind === 'ready' && made.extrapolated > 0 && (
        <p class="callout warn" data-testid="storm-extrapolated">
          {made.extrapolated} reading{made.extrapolated === 1 ? ' is' : 's are'} outside the rating's gauged range: those
          discharges are extrapolated, and so are the figures that use them.
        </p>
      )}
      {found && !found.ok && draft.points === undefined && (
        <p class="callout warn" role="alert">No storm event found in this window: {found.message}</p>
      )}

      {result && !result.ok && (
        <p class="callout warn" role="alert" data-testid="storm-error">The results cannot be worked out: {result.message}</p>
      )}

      {result?.ok && points && (
        <section class="card" aria-labelledby="storm-results-heading">
          <h3 id="storm-results-heading">Results (rise start to end of runoff)</h3>
          <EventFigures
            summary={result.value.summary}
            units={units}
            timeZone={zone}
            depthMissing={area === undefined ? 'needs the catchment area of the site' : undefined}
            coefficientMissing={area === undefined ? 'needs the catchment area of the site' : 'enter the rainfall depth'}
          />
        </section>
      )}

      {plot && (
        <section aria-labelledby="storm-plot-heading">
          <h3 id="storm-plot-heading">Hydrograph</h3>
          <div class="storm-toggles">
            <label class="choice">
              <input type="checkbox" checked={logScale} onChange={(e) => setLogScale(e.currentTarget.checked)} />
              Log scale (a recession is a straight line)
            </label>
            <label class="choice">
              <input type="checkbox" checked={wholeWindow} onChange={(e) => setWholeWindow(e.currentTarget.checked)} />
              Whole window
            </label>
          </div>
          <Hydrograph
            time_ms={plot.time_ms}
            lines={plot.lines}
            yLabel={`Discharge (${displayUnit('discharge', units)})`}
            timeZone={zone}
            height={220}
            logScale={logScale}
            markers={markers}
            description={
              result?.ok && points
                ? `Discharge and baseflow; peak ${formatQuantity('discharge', result.value.summary.peak_m3s, units)} at ${formatTime(points.peak_ms, zone)}, direct runoff from ${formatTime(points.riseStart_ms, zone)} to ${formatTime(points.runoffEnd_ms, zone)}.`
                : 'Discharge of the readings window.'
            }
          />
          {points && (
            <dl class="facts storm-points" data-testid="key-point-times">
              <dt>R rise start</dt>
              <dd>{formatTime(points.riseStart_ms, zone)}</dd>
              <dt>P peak</dt>
              <dd>{formatTime(points.peak_ms, zone)}</dd>
              <dt>I inflection</dt>
              <dd>{formatTime(points.inflection_ms, zone)}</dd>
              <dt>E end of runoff</dt>
              <dd>{formatTime(points.runoffEnd_ms, zone)}</dd>
            </dl>
          )}
        </section>
      )}

      {series && points && (
        <>
          <SeparationPicker
            value={draft.method}
            onChange={(method) => {
              setSave({ status: 'idle' });
              dispatch({ type: 'method', method });
            }}
          />
          {!usesKeyPoints(draft.method.kind) && (
            <p class="hint">
              A filter runs over the whole readings window; the key points only set the event whose volumes are summed.
            </p>
          )}
          <label for="storm-rain">
            Rainfall depth ({depthUnit})
            <span class="hint" id="storm-rain-hint">
              {area === undefined ? 'The runoff coefficient needs the catchment area: add it to the site.' : 'From the rain gauge, for the runoff coefficient.'}
            </span>
          </label>
          <input
            id="storm-rain"
            inputMode="decimal"
            autocomplete="off"
            aria-describedby="storm-rain-hint"
            aria-invalid={rain.problem ? true : undefined}
            value={draft.rainfall}
            onInput={(e) => dispatch({ type: 'rainfall', text: e.currentTarget.value })}
          />
          {rain.problem && <p class="callout warn">{rain.problem}</p>}
          <KeyPointFields
            value={points}
            onChange={(next) => {
              setSave({ status: 'idle' });
              dispatch({ type: 'points', points: next });
            }}
            timeZone={zone}
            first_ms={series.time_ms[0]}
            last_ms={series.time_ms[series.time_ms.length - 1]}
            edited={draft.points !== undefined}
            onFindAgain={() => dispatch({ type: 'find-again' })}
            crossCheck={crossCheck}
          />
        </>
      )}

      {notes.length > 0 && (
        <section aria-labelledby="storm-notes-heading">
          <h3 id="storm-notes-heading">How these figures were found</h3>
          <ul class="storm-notes" data-testid="storm-notes">
            {notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        </section>
      )}

      {result?.ok && (
        <section aria-labelledby="storm-save-heading">
          <h3 id="storm-save-heading">Keep this analysis</h3>
          <label for="storm-note">Note (optional)</label>
          <textarea id="storm-note" value={draft.note} onInput={(e) => dispatch({ type: 'note', text: e.currentTarget.value })} />
          <button type="button" class="primary wide storm-save" disabled={save.status === 'saving'} onClick={() => void saveNow()}>
            {save.status === 'saving' ? 'Saving…' : 'Save this analysis'}
          </button>
          <div role="status" aria-live="polite">
            {save.status === 'saved' && (
              <p class="callout ok" data-testid="storm-saved">Saved on this phone at {formatTime(save.at_ms, zone)}.</p>
            )}
          </div>
          {save.status === 'failed' && <p class="callout bad" role="alert">Not saved: {save.message}</p>}
        </section>
      )}

      <SavedAnalyses siteId={site.id} units={units} timeZone={zone} />
    </div>
  );
}
