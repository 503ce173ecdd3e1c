// The part of the storm screen that stays in view: the hydrograph (discharge, baseflow, direct runoff
// shaded, key-point lines and draggable handles), the tap readout and the figures strip.
import type { RefObject } from 'preact';
import type { Dispatch } from 'preact/hooks';
import { useCallback, useMemo, useState } from 'preact/hooks';
import { displayUnit, toDisplay, type SiteRecord } from '../../../core';
import { Plot, type PlotApi, type PlotBand, type PlotDrawView, type PlotGeometry, type PlotSeries } from '../../components/Plot';
import { formatQuantity, formatTime } from '../../format';
import type { StormAction, StormDraft, TimeWindow } from './draft';
import { KeyPointHandles } from './handles';
import { KEY_ORDER } from './key-point-order';
import { ResultsStrip } from './results-strip';
import type { StormAnalysis } from './use-storm-analysis';

/** Props: the site, the draft and its dispatch, the window, the analysis, the view switches and the plot's handle. */
export interface StormStageProps {
  site: SiteRecord;
  draft: StormDraft;
  dispatch: Dispatch<StormAction>;
  win: TimeWindow | undefined;
  analysis: StormAnalysis;
  logScale: boolean;
  showAll: boolean;
  api: RefObject<PlotApi | undefined>;
  stageRef: (el: HTMLDivElement | null) => void;
}

/** The plot, readout and figures of the window's storm (nothing until the window has a discharge series). */
export function StormStage({ site, draft, dispatch, win, analysis, logScale, showAll, api, stageRef }: StormStageProps) {
  const { series, points, foundPoints, result, range, flags, rain } = analysis;
  const [readout, setReadout] = useState<number>();
  const zone = site.timeZone;
  const units = site.displayUnits;
  const qUnit = displayUnit('discharge', units);

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

  if (!series || !discharge) return null;
  return (
    <div class="storm-stage" ref={stageRef}>
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
          hasArea={site.area_km2 !== undefined}
          rainfall={draft.rainfall}
          rainfallProblem={rain.problem}
          onRainfall={(text) => dispatch({ type: 'rainfall', text })}
        />
      )}
    </div>
  );
}
