// Test-only page: times the storm plot in Chromium for the benchmark, with the same engine, core calls and
// screen logic the storm screen uses (web/components/Plot/engine, web/screens/Storm).
import { demoFlow, findEventPoints, separateBaseflow, toDisplay, type EventPoints } from '../../../../core/index';
import { createPlot, type PlotEngine } from '../../../../web/components/Plot/engine';
import type { PlotProps } from '../../../../web/components/Plot/types';
import { analyse, type StormSeries } from '../../../../web/screens/Storm/analysis';
import { movePoint } from '../../../../web/screens/Storm/key-point-order';
import { defaultMethodChoice } from '../../../../web/screens/Storm/method-choice';
import { everyMethod } from '../../../../web/screens/Storm/method-table';

const T0 = Date.UTC(2026, 2, 1);
const STEP_MS = 900_000;
const host = document.getElementById('plot')!;

/** n readings every 15 minutes of the invented demo flow (core/demo), repeating every 21 days. */
function record(n: number): StormSeries {
  const time_ms = new Float64Array(n);
  const discharge_m3s = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    time_ms[i] = T0 + i * STEP_MS;
    discharge_m3s[i] = demoFlow(((i * STEP_MS) / 86_400_000) % 21);
  }
  return { time_ms, discharge_m3s, stage_m: new Float64Array(n), extrapolated: new Uint8Array(n) };
}

// The discharge line in display units, made once per record as the screen memoises it.
const shown = new WeakMap<StormSeries, Float64Array>();

function props(series: StormSeries, baseflow: Float64Array | undefined): PlotProps {
  let q = shown.get(series);
  if (!q) shown.set(series, (q = Float64Array.from(series.discharge_m3s, (v) => toDisplay('discharge', v, 'metric'))));
  const s: PlotProps['series'] = [{ label: 'Discharge', values: q }];
  if (baseflow) s.push({ label: 'Baseflow', values: Float64Array.from(baseflow, (v) => toDisplay('discharge', v, 'metric')), dash: [6, 4] });
  return {
    x: series.time_ms,
    xAxis: { kind: 'time', timeZone: 'Pacific/Auckland' },
    series: s,
    bands: baseflow ? [{ upper: 0, lower: 1, fill: 'rgba(10,109,140,0.22)' }] : undefined,
    yLabel: 'Discharge (m³/s)',
    height: 170,
    description: 'Benchmark plot',
  };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

const api = {
  /**
   * Median ms of one drag step on an n-reading event (move the end of runoff to a reading, recompute the
   * baseflow, the figures and every method's volume, redraw the plot) and of a redraw alone (new baseflow
   * line converted and drawn, nothing recomputed), alternated so both see the same machine load.
   */
  dragStep(n: number, steps: number): { drag_ms: number; redraw_ms: number } {
    const series = record(n);
    const found = findEventPoints(series, { area_km2: 12.4 });
    let points: EventPoints = found;
    const method = { kind: 'variable-slope' } as const;
    const first = analyse(series, points, method, 12.4, 38);
    if (!first.ok) throw new Error(first.message);
    const engine: PlotEngine = createPlot(host, props(series, first.value.baseflow_m3s), 360, () => undefined);
    const drag: number[] = [];
    const redraw: number[] = [];
    const i0 = series.time_ms.indexOf(series.time_ms.find((t) => t >= found.runoffEnd_ms)!);
    const other = analyse(series, { ...found, runoffEnd_ms: series.time_ms[i0 + 8] }, method, 12.4, 38);
    if (!other.ok) throw new Error(other.message);
    for (let k = 0; k < steps; k++) {
      const target = series.time_ms[i0 + (k % 2 === 0 ? 6 : -6)];
      let t = performance.now();
      points = movePoint(points, 'runoffEnd_ms', target, series.time_ms).points;
      const r = analyse(series, points, method, 12.4, 38);
      if (!r.ok) throw new Error(r.message);
      everyMethod(series, points, 12.4, defaultMethodChoice);
      engine.update(props(series, r.value.baseflow_m3s));
      drag.push(performance.now() - t);
      t = performance.now();
      engine.update(props(series, (k % 2 === 0 ? other : first).value.baseflow_m3s));
      redraw.push(performance.now() - t);
    }
    engine.destroy();
    return { drag_ms: median(drag), redraw_ms: median(redraw) };
  },
  /** Median ms to build and draw an n-reading plot with its baseflow and shading, and with the bare series. */
  render(n: number, runs: number): { withBaseflow_ms: number; bare_ms: number } {
    const series = record(n);
    const baseflow = separateBaseflow(series, { kind: 'lyne-hollick' });
    const withB = props(series, baseflow);
    const bare = props(series, undefined);
    const time = (p: PlotProps) => {
      const t = performance.now();
      const e = createPlot(host, p, 360, () => undefined);
      e.api.flush();
      const ms = performance.now() - t;
      e.destroy();
      return ms;
    };
    time(withB);
    time(bare);
    const a: number[] = [];
    const b: number[] = [];
    for (let k = 0; k < runs; k++) {
      b.push(time(bare));
      a.push(time(withB));
    }
    return { withBaseflow_ms: median(a), bare_ms: median(b) };
  },
};

declare global {
  interface Window {
    freshetPlotTest: typeof api;
  }
}
window.freshetPlotTest = api;
document.body.dataset.ready = 'true';
