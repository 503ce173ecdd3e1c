// One site's storm analysis, built around the plot: storms found for you, the hydrograph with draggable
// key points and the figures always in view, every method side by side, save, reopen and share. The
// numbers come from two hooks (use-storm-search.ts: the storm list; use-storm-analysis.ts: the window's
// analysis); the plot, readout and figures strip are storm-stage.tsx.
import { useEffect, useMemo, useReducer, useRef, useState } from 'preact/hooks';
import type { EventPoints, SiteRecord } from '../../../core';
import type { PlotApi } from '../../components/Plot';
import { SeparationPicker } from '../../components/SeparationPicker';
import { formatTime } from '../../format';
import { initialDraft, stormReducer, type TimeWindow } from './draft';
import { minimaWindow_days, usesKeyPoints, usesMinima } from './method-choice';
import { MethodSpreadTable } from './method-spread';
import { SavedAnalyses } from './saved-analyses';
import { StormActions } from './storm-actions';
import { StormList } from './storm-list';
import { StormStage } from './storm-stage';
import { useStormAnalysis } from './use-storm-analysis';
import { SEARCH_DAYS, useStormSearch } from './use-storm-search';
import { WindowFields } from './window-fields';


const DAY_MS = 86_400_000;
/** The window shown when no storm is found: this many days up to the latest reading. */
const FALLBACK_WINDOW_DAYS = 14;

/** The first whole minute at or after t_ms (UTC ms): window ends the minute fields show exactly. */
const wholeMinuteAfter = (t_ms: number): number => Math.ceil(t_ms / 60_000) * 60_000;

/** A window widened about its middle to at least need_days, ending no later than last_ms. */
function widened(win: TimeWindow, need_days: number | undefined, last_ms: number): TimeWindow {
  if (need_days === undefined || win.to_ms - win.from_ms >= need_days * DAY_MS) return win;
  const mid = (win.from_ms + win.to_ms) / 2;
  // Whole minutes, as the window fields show it (the last reading's own minute, rounded up, as the end).
  const to_ms = Math.min(wholeMinuteAfter(last_ms), wholeMinuteAfter(Math.max(win.to_ms, mid + (need_days * DAY_MS) / 2)));
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
  const api = useRef<PlotApi | undefined>(undefined);
  const [stage, setStage] = useState<HTMLDivElement | null>(null);
  useStickyScrollPadding(stage);
  const zone = site.timeZone;
  const units = site.displayUnits;
  const area = site.area_km2;

  const { latest, last_ms, searchMade, storms } = useStormSearch(site);
  // The newest storm found opens first; without one, the last days of the record.
  const baseWindow = useMemo<TimeWindow | undefined>(() => {
    if (draft.window) return draft.window;
    if (last_ms === undefined || !searchMade) return undefined;
    if (storms && storms.length > 0) return storms[0].window;
    return { from_ms: wholeMinuteAfter(last_ms) - FALLBACK_WINDOW_DAYS * DAY_MS, to_ms: wholeMinuteAfter(last_ms) };
  }, [draft.window, last_ms, searchMade, storms]);
  const need_days = usesMinima(draft.method.kind) ? minimaWindow_days(draft.method.kind, area) : undefined;
  const win = baseWindow && last_ms !== undefined ? widened(baseWindow, need_days, last_ms) : baseWindow;
  const wasWidened = !!win && !!baseWindow && win.from_ms !== baseWindow.from_ms;

  const analysis = useStormAnalysis(site, draft, win);
  const { rows, made, series, found, points, rainfall_mm, madeMethod, result, all, spread, se, range } = analysis;

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
      {latest.state === 'ready' && latest.value === undefined && (
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
          onOpen={(s) => dispatch({ type: 'storm', window: s.window })}
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

      <StormStage site={site} draft={draft} dispatch={dispatch} win={win} analysis={analysis} logScale={logScale} showAll={showAll} api={api} stageRef={setStage} />
      <div role="status" aria-live="polite">
        {draft.stopped && <p class="callout warn" data-testid="point-stopped">{draft.stopped}</p>}
      </div>
      {result && !result.ok && (
        <p class="callout warn" role="alert" data-testid="storm-error">The figures cannot be worked out: {result.message}</p>
      )}
      {'problem' in madeMethod && <p class="callout warn">{madeMethod.problem}</p>}

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

      {all && points && <MethodSpreadTable rows={all} spread={spread} chosen={draft.method.kind} units={units} range={range} />}

      {series && points && (
        <details class="card storm-method" open={!usesKeyPoints(draft.method.kind)}>
          <summary>Baseflow method</summary>
          <SeparationPicker
            value={draft.method}
            problem={'problem' in madeMethod ? madeMethod.problem : undefined}
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
          plot={() => api.current}
        />
      )}

      <SavedAnalyses siteId={site.id} units={units} timeZone={zone} openId={draft.reopened} onOpen={(d) => dispatch({ type: 'reopen', draft: d })} />
    </div>
  );
}
