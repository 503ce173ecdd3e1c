// One site's storm analysis, built around the plot: storms found for you, the hydrograph with draggable
// key points and the figures always in view, every method side by side, save, reopen and share.
import { useCallback, useEffect, useMemo, useReducer, useRef, useState } from 'preact/hooks';
import { displayUnit, fromDisplay, toDisplay, type EventPoints, type SiteRecord } from '../../../core';
import { Plot, type PlotApi, type PlotBand, type PlotDrawView, type PlotGeometry, type PlotSeries } from '../../components/Plot';
import { SeparationPicker } from '../../components/SeparationPicker';
import { latestReading, listRatings, seriesWithDischarge } from '../../db';
import { formatQuantity, formatTime, parseDecimal } from '../../format';
import { useRecords } from '../../components/use-records';
import { analyse, findPoints, seriesFromReadings } from './analysis';
import { initialDraft, stormReducer, type TimeWindow } from './draft';
import { KeyPointHandles } from './handles';
import { KEY_ORDER, nearestIndex } from './key-point-order';
import { methodFor, minimaWindow_days, usesKeyPoints, usesMinima } from './method-choice';
import { MethodSpreadTable } from './method-spread';
import { everyMethod, methodSpread } from './method-table';
import { ResultsStrip } from './results-strip';
import { DEFAULT_RATING_SE_PCT, runoffRange } from './runoff-range';
import { SavedAnalyses } from './saved-analyses';
import { StormActions } from './storm-actions';
import { StormList } from './storm-list';
import { findStorms, stormWindow } from './storms';
import { WindowFields } from './window-fields';

const DAY_MS = 86_400_000;
/** Days of record searched for storms, up to the latest reading. */
export const SEARCH_DAYS = 60;
/** The window shown when no storm is found: this many days up to the latest reading. */
const FALLBACK_WINDOW_DAYS = 14;

/** A window widened about its middle to at least need_days, ending no later than last_ms. */
function widened(win: TimeWindow, need_days: number | undefined, last_ms: number): TimeWindow {
  if (need_days === undefined || win.to_ms - win.from_ms >= need_days * DAY_MS) return win;
  const mid = (win.from_ms + win.to_ms) / 2;
  // Whole minutes, as the window fields show it.
  const to_ms = Math.min(last_ms, Math.ceil(Math.max(win.to_ms, mid + (need_days * DAY_MS) / 2) / 60_000) * 60_000);
  return { from_ms: to_ms - need_days * DAY_MS, to_ms };
}

/**
 * Keeps whatever is scrolled to or focused clear of the plot and figures that stay at the top (and of the
 * bottom bar): the page's scroll padding follows the sticky area's height while the screen is open.
 */
function useStickyScrollPadding(stage: HTMLElement | null): void {
  useEffect(() => {
    if (!stage) return;
    const root = document.documentElement;
    const resize = new ResizeObserver(() => {
      root.style.scrollPaddingTop = `${stage.getBoundingClientRect().height + 60}px`;
    });
    resize.observe(stage);
    root.style.scrollPaddingBottom = 'calc(var(--nav-h) + 8px)';
    return () => {
      resize.disconnect();
      root.style.scrollPaddingTop = '';
      root.style.scrollPaddingBottom = '';
    };
  }, [stage]);
}

/** The storm screen for one site (the parent keys it by site id, so a new site starts a fresh draft). */
export function SiteStorm({ site }: { site: SiteRecord }) {
  const [draft, dispatch] = useReducer(stormReducer, initialDraft);
  const [logScale, setLogScale] = useState(false);
  const [showAll, setShowAll] = useState(false);
  const [readout, setReadout] = useState<number>();
  const api = useRef<PlotApi | undefined>(undefined);
  const [stage, setStage] = useState<HTMLDivElement | null>(null);
  useStickyScrollPadding(stage);
  const zone = site.timeZone;
  const units = site.displayUnits;
  const area = site.area_km2;
  const qUnit = displayUnit('discharge', units);

  const latest = useRecords(() => latestReading(site.id), ['reading'], [site.id]);
  const last_ms = latest.state === 'ready' && latest.value ? latest.value.time_ms : undefined;
  const searched = useRecords(
    async () => (last_ms === undefined ? undefined : seriesWithDischarge(site.id, last_ms - SEARCH_DAYS * DAY_MS, last_ms)),
    ['reading', 'rating'],
    [site.id, last_ms],
  );
  const searchMade = useMemo(() => (searched.state === 'ready' && searched.value ? seriesFromReadings(searched.value) : undefined), [searched]);
  const storms = useMemo(() => (searchMade?.kind === 'ready' ? findStorms(searchMade.series, area) : undefined), [searchMade, area]);
  const baseWindow = useMemo<TimeWindow | undefined>(() => {
    if (draft.window) return draft.window;
    if (last_ms === undefined || !searchMade) return undefined;
    if (storms && storms.length > 0 && searchMade.kind === 'ready') {
      return stormWindow(storms[0].points, area, { first_ms: searchMade.series.time_ms[0], last_ms });
    }
    return { from_ms: last_ms - FALLBACK_WINDOW_DAYS * DAY_MS, to_ms: last_ms };
  }, [draft.window, last_ms, searchMade, storms, area]);
  const need_days = usesMinima(draft.method.kind) ? minimaWindow_days(draft.method.kind, area) : undefined;
  const win = baseWindow && last_ms !== undefined ? widened(baseWindow, need_days, last_ms) : baseWindow;
  const wasWidened = !!win && !!baseWindow && win.from_ms !== baseWindow.from_ms;

  const rows = useRecords(
    async () => (win ? seriesWithDischarge(site.id, win.from_ms, win.to_ms) : undefined),
    ['reading', 'rating'],
    [site.id, win?.from_ms, win?.to_ms],
  );
  const ratings = useRecords(() => listRatings(site.id), ['rating'], [site.id]);
  const made = useMemo(() => (rows.state === 'ready' && rows.value ? seriesFromReadings(rows.value) : undefined), [rows]);
  const series = made?.kind === 'ready' ? made.series : undefined;
  const found = useMemo(() => (series ? findPoints(series, area) : undefined), [series, area]);
  const foundPoints = found?.ok ? found.value.points : undefined;
  const points = draft.points ?? foundPoints;

  const rain = useMemo((): { mm?: number; problem?: string } => {
    if (draft.rainfall.trim() === '') return {};
    const v = parseDecimal(draft.rainfall);
    if (v === undefined || !(v > 0)) {
      return { problem: `Rainfall needs a number above 0 in ${displayUnit('depth', units)}; "${draft.rainfall.trim()}" cannot be read as one.` };
    }
    return { mm: fromDisplay('depth', v, units) };
  }, [draft.rainfall, units]);
  const rainfall_mm = area === undefined ? undefined : rain.mm;

  const made_method = useMemo(() => methodFor(draft.method, area), [draft.method, area]);
  const method = 'method' in made_method ? made_method.method : undefined;
  const result = useMemo(
    () => (series && points && method ? analyse(series, points, method, area, rainfall_mm) : undefined),
    [series, points, method, area, rainfall_mm],
  );
  const all = useMemo(() => (series && points ? everyMethod(series, points, area, draft.method) : undefined), [series, points, area, draft.method]);
  const spread = useMemo(() => (all ? methodSpread(all) : undefined), [all]);

  // The rating behind the peak reading gives the standard error; a rating without fit statistics gets the stated default.
  const se = useMemo(() => {
    const window = rows.state === 'ready' ? rows.value : undefined;
    if (!window || !series || !points || ratings.state !== 'ready') return undefined;
    const at = nearestIndex(window.time_ms, points.peak_ms);
    const id = window.ratingIds[window.ratingIndex[at]];
    const pct = ratings.value.find((r) => r.id === id)?.fit?.standardError_pct;
    return pct === undefined ? { pct: DEFAULT_RATING_SE_PCT, isDefault: true } : { pct: Number(pct.toPrecision(2)), isDefault: false };
  }, [rows, series, points, ratings]);
  const range = useMemo(
    () => (result?.ok && all && se ? runoffRange(result.value.summary.directVolume_m3, all.flatMap((r) => (r.volume_m3 === undefined ? [] : [r.volume_m3])), se.pct) : undefined),
    [result, all, se],
  );
  const flags = useMemo(() => {
    if (!series || !points) return { peak: false, volume: false };
    const a = nearestIndex(series.time_ms, points.riseStart_ms);
    const b = nearestIndex(series.time_ms, points.runoffEnd_ms);
    let any = false;
    for (let i = a; i <= b; i++) any ||= series.extrapolated[i] === 1;
    return { peak: series.extrapolated[nearestIndex(series.time_ms, points.peak_ms)] === 1, volume: any };
  }, [series, points]);

  const discharge = useMemo(() => (series ? Float64Array.from(series.discharge_m3s, (v) => toDisplay('discharge', v, units)) : undefined), [series, units]);
  const baseflowShown = useMemo(() => (result?.ok ? Float64Array.from(result.value.baseflow_m3s, (v) => toDisplay('discharge', v, units)) : undefined), [result, units]);
  const plotSeries = useMemo<PlotSeries[]>(() => {
    if (!discharge) return [];
    const s: PlotSeries[] = [{ label: 'Discharge', values: discharge, colour: '--accent', width: 2 }];
    if (baseflowShown) s.push({ label: 'Baseflow', values: baseflowShown, colour: '--warn-line', width: 2, dash: [6, 4] });
    return s;
  }, [discharge, baseflowShown]);
  const bands = useMemo<PlotBand[] | undefined>(() => (baseflowShown ? [{ upper: 0, lower: 1, fill: 'rgba(10,109,140,0.22)' }] : undefined), [baseflowShown]);
  const xAxis = useMemo(() => ({ kind: 'time' as const, timeZone: zone }), [zone]);
  const draw = useCallback(
    (view: PlotDrawView) => {
      if (!points) return;
      view.ctx.strokeStyle = view.colour('--muted', '#4a5358');
      view.ctx.lineWidth = view.ratio;
      view.ctx.setLineDash([3 * view.ratio, 4 * view.ratio]);
      for (const key of KEY_ORDER) {
        const x = view.xPos(points[key]);
        if (!(x >= view.area.left && x <= view.area.left + view.area.width)) continue;
        view.ctx.beginPath();
        view.ctx.moveTo(x, view.area.top);
        view.ctx.lineTo(x, view.area.top + view.area.height);
        view.ctx.stroke();
      }
    },
    [points],
  );
  // The event with half its length either side, until the user zooms, pans or asks for the whole window.
  const eventView = useMemo(() => {
    if (!foundPoints && !draft.points) return undefined;
    const p = (draft.points ?? foundPoints)!;
    const margin = 0.5 * (p.runoffEnd_ms - p.riseStart_ms);
    return { min: p.riseStart_ms - margin, max: p.runoffEnd_ms + margin };
    // Only a new window or storm moves the view; dragging a point must not.
  }, [win?.from_ms, win?.to_ms, foundPoints === undefined, draft.reopened]);
  const viewKey = `${win?.from_ms}-${win?.to_ms}-${draft.reopened ?? ''}-${showAll}`;

  const overlay = useCallback(
    (g: PlotGeometry) =>
      series && points && discharge ? (
        <KeyPointHandles
          geometry={g}
          points={points}
          time_ms={series.time_ms}
          y={discharge}
          timeZone={zone}
          onMove={(key, to_ms) => dispatch({ type: 'move', key, to_ms, from: points, times: series.time_ms })}
          onStep={(key, steps) => dispatch({ type: 'step', key, steps, from: points, times: series.time_ms })}
        />
      ) : null,
    [series, points, discharge, zone],
  );

  const onTap = useCallback((i: number) => setReadout(i), []);
  const readoutText =
    readout !== undefined && series && readout < series.time_ms.length
      ? `${formatTime(series.time_ms[readout], zone)} · stage ${formatQuantity('stage', series.stage_m[readout], units)} · discharge ${formatQuantity('discharge', series.discharge_m3s[readout], units)}${
          result?.ok ? ` · baseflow ${formatQuantity('discharge', result.value.baseflow_m3s[readout], units)}` : ''
        }`
      : undefined;

  const notes = [
    ...(made?.kind === 'ready' && made.skipped > 0
      ? [`${made.skipped} manual reading${made.skipped === 1 ? '' : 's'} at the same time as a logger reading ${made.skipped === 1 ? 'was' : 'were'} left out: the logger record is used.`]
      : []),
    ...(wasWidened && need_days ? [`The window was widened to ${need_days} days: this method needs low flows on both sides of the storm.`] : []),
    ...(draft.points === undefined && found?.ok ? found.value.notes : []),
    ...(result?.ok ? result.value.notes : []),
  ];

  return (
    <div class="storm">
      {latest.state === 'ready' && !latest.value && (
        <p class="callout" data-testid="storm-no-readings">
          There are no readings at this site yet. <a href="#/record">Record a reading</a> or import the logger first.
        </p>
      )}
      {storms && last_ms !== undefined && (
        <StormList
          last_ms={last_ms}
          storms={storms}
          openPeak_ms={points?.peak_ms}
          units={units}
          timeZone={zone}
          days={SEARCH_DAYS}
          onOpen={(s) => searchMade?.kind === 'ready' && last_ms !== undefined && dispatch({ type: 'storm', window: stormWindow(s.points, area, { first_ms: searchMade.series.time_ms[0], last_ms }) })}
        />
      )}
      {rows.state === 'failed' && <p class="callout bad">{rows.message}</p>}
      {win && made?.kind === 'empty' && <p class="callout">There are no readings in this window. Move the window to a time with readings.</p>}
      {made?.kind === 'unrated' && (
        <p class="callout warn" data-testid="storm-unrated">
          {made.count} of the {made.total} readings in this window have no rating in force (the first at {formatTime(made.firstTime_ms, zone)}), so they
          have no discharge and the storm cannot be worked out. Enter or fit a rating valid from before the window, or start the window later.
        </p>
      )}
      {found && !found.ok && draft.points === undefined && (
        <p class="callout warn" role="alert">No storm in this window: {found.message}</p>
      )}

      {series && discharge && (
        <div class="storm-stage" ref={setStage}>
          <Plot
            x={series.time_ms}
            xAxis={xAxis}
            series={plotSeries}
            bands={bands}
            yLabel={`Discharge (${qUnit})`}
            logY={logScale}
            height={170}
            description={
              result?.ok && points
                ? `Discharge and baseflow with the direct runoff shaded; peak ${formatQuantity('discharge', result.value.summary.peak_m3s, units)} at ${formatTime(points.peak_ms, zone)}.`
                : 'Discharge of the readings window.'
            }
            initialView={showAll ? undefined : eventView}
            viewKey={viewKey}
            onTap={onTap}
            draw={draw}
            overlay={overlay}
            onApi={(a) => (api.current = a)}
            className="storm-plot"
          />
          <p class="readout" data-testid="readout" aria-live="polite">
            {readoutText ?? 'Tap to read a time · drag a handle · pinch to zoom'}
          </p>
          {result?.ok && (
            <ResultsStrip
              summary={result.value.summary}
              range={range}
              peakExtrapolated={flags.peak}
              volumeExtrapolated={flags.volume}
              units={units}
              hasArea={area !== undefined}
              rainfall={draft.rainfall}
              rainfallProblem={rain.problem}
              onRainfall={(text) => dispatch({ type: 'rainfall', text })}
            />
          )}
        </div>
      )}
      <div role="status" aria-live="polite">
        {draft.stopped && <p class="callout warn" data-testid="point-stopped">{draft.stopped}</p>}
      </div>
      {result && !result.ok && (
        <p class="callout warn" role="alert" data-testid="storm-error">The figures cannot be worked out: {result.message}</p>
      )}
      {'problem' in made_method && <p class="callout warn">{made_method.problem}</p>}

      {series && points && (
        <div class="storm-tools">
          <label class="choice">
            <input type="checkbox" checked={logScale} onChange={(e) => setLogScale(e.currentTarget.checked)} />
            Log scale (a recession is straight)
          </label>
          <label class="choice">
            <input type="checkbox" checked={showAll} onChange={(e) => setShowAll(e.currentTarget.checked)} />
            Whole window
          </label>
          <button type="button" disabled={draft.points === undefined} onClick={() => dispatch({ type: 'reset' })}>
            Reset key points
          </button>
        </div>
      )}

      {all && points && <MethodSpreadTable rows={all} spread={spread} chosen={draft.method.kind} units={units} range={range} se={se} />}

      {series && points && (
        <details class="card storm-method" open={!usesKeyPoints(draft.method.kind)}>
          <summary>Baseflow method</summary>
          <SeparationPicker
            value={draft.method}
            problem={'problem' in made_method ? made_method.problem : undefined}
            onKind={(kind) => {
              // A minima method widens the window; keep the storm's points so the storm stays the same.
              if (usesMinima(kind) && draft.points === undefined && points) dispatch({ type: 'points', points });
              dispatch({ type: 'method', kind });
            }}
            onConstant={(field, text) => dispatch({ type: 'constant', field, text })}
          />
        </details>
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

      {win && <WindowFields window={win} timeZone={zone} onChange={(w: TimeWindow) => dispatch({ type: 'window', window: w })} count={series?.time_ms.length} />}

      {result?.ok && series && points && win && (
        <StormActions
          site={site}
          draft={draft}
          dispatch={dispatch}
          window={win}
          points={points as EventPoints}
          result={result.value}
          series={series}
          rainfall_mm={rainfall_mm}
          rangeLine={range}
          se={se}
          plot={() => api.current}
        />
      )}

      <SavedAnalyses siteId={site.id} units={units} timeZone={zone} openId={draft.reopened} onOpen={(d) => dispatch({ type: 'reopen', draft: d })} />
    </div>
  );
}
