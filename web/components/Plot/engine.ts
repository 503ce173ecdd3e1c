// The uPlot side of the Plot component, loaded on first use so the chart library stays out of the first
// visit. Builds the plot once, feeds it new data and sizes, and turns touch and mouse gestures into x-axis
// zoom, pan and taps. Times arrive in UTC ms; uPlot wants seconds, so they are divided here and only here.
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { numberTickLabel, timeTickLabels } from './time-axis';
import type { PlotApi, PlotGeometry, PlotProps } from './types';
import { clampRange, panBy, pinchRange, zoomAbout, type XRange } from './view-range';

/** A plot built on a host element: update with new props, resize, destroy. */
export interface PlotEngine {
  update(props: PlotProps): void;
  setWidth(width_px: number): void;
  api: PlotApi;
  destroy(): void;
}

/** Movement (CSS px) below which a press counts as a tap. */
const TAP_SLOP_PX = 8;

function cssVar(name: string, fallback: string): string {
  const v = getComputedStyle(document.documentElement).getPropertyValue(name).trim();
  return v || fallback;
}

/** A colour given as a CSS colour or as a theme variable name ('--accent'). */
function colourOf(spec: string | undefined, fallback: string): string {
  if (!spec) return fallback;
  return spec.startsWith('--') ? cssVar(spec, fallback) : spec;
}

/** x scale factor: uPlot's time axes count seconds. */
function xScale(props: PlotProps): number {
  return props.xAxis.kind === 'time' ? 1000 : 1;
}

/** The structure of a plot: when it changes the plot is rebuilt, otherwise only its data are replaced. */
export function shapeKey(props: PlotProps): string {
  const x = props.xAxis.kind === 'time' ? `t:${props.xAxis.timeZone}` : `n:${props.xAxis.label}:${props.xAxis.log === true}`;
  const s = props.series.map((l) => `${l.label}/${l.colour}/${l.dash}/${l.points === true}/${l.width}`).join('|');
  const b = (props.bands ?? []).map((band) => `${band.upper}-${band.lower}-${band.fill}`).join('|');
  return `${x}#${s}#${b}#${props.yLabel}#${props.logY === true}#${props.height}#${props.zoom !== false}`;
}

type Column = (number | null)[];

/** Builds a plot of props on host (sized to width_px) and wires its gestures. */
export function createPlot(host: HTMLElement, first: PlotProps, width_px: number, onView: () => void): PlotEngine {
  let props = first;
  const scale = xScale(props);
  // Converted columns are kept per source array, so a drag that changes only the baseflow converts only it.
  let columns = new WeakMap<object, Column>();
  const column = (values: ArrayLike<number>, log: boolean): Column => {
    const key = values as unknown as object;
    const hit = columns.get(key);
    if (hit) return hit;
    const n = values.length;
    let clean = values instanceof Float64Array;
    for (let i = 0; clean && i < n; i++) {
      const v = values[i];
      if (!(v === v && v !== Infinity && v !== -Infinity) || (log && !(v > 0))) clean = false;
    }
    // A typed array with no gap goes to uPlot as it is (uPlot reads it by index); only gaps need nulls.
    let out: Column;
    if (clean) out = values as unknown as Column;
    else {
      out = new Array(n);
      for (let i = 0; i < n; i++) {
        const v = values[i];
        out[i] = Number.isFinite(v) && (!log || v > 0) ? v : null;
      }
    }
    columns.set(key, out);
    return out;
  };
  let xs: Float64Array = new Float64Array(0);
  let xsOf: ArrayLike<number> | undefined;
  const dataOf = (p: PlotProps): uPlot.AlignedData => {
    if (xsOf !== p.x) {
      const n = p.x.length;
      xs = new Float64Array(n);
      for (let i = 0; i < n; i++) xs[i] = p.x[i] / scale;
      xsOf = p.x;
    }
    return [xs as unknown as number[], ...p.series.map((s) => column(s.values, p.logY === true))];
  };
  const extent = (): XRange => ({ min: xs[0] ?? 0, max: xs[xs.length - 1] ?? 1 });
  // Never zoom in closer than a few x steps.
  const minSpan = () => (xs.length > 1 ? (3 * (xs[xs.length - 1] - xs[0])) / (xs.length - 1) : 1);

  const text = cssVar('--text', '#15191c');
  const grid = cssVar('--line', '#c9c4b8');
  const palette = [cssVar('--accent', '#0a6d8c'), cssVar('--warn-line', '#a15c00'), cssVar('--bad-line', '#b3261e')];
  const axis: uPlot.Axis = { stroke: text, grid: { stroke: grid, width: 1 }, ticks: { stroke: grid, width: 1 }, font: '12px system-ui, sans-serif' };
  const xAxis: uPlot.Axis =
    props.xAxis.kind === 'time'
      ? {
          ...axis,
          size: 44,
          space: 64,
          values: (_u, splits, _i, _space, incr) => {
            const zone = props.xAxis.kind === 'time' ? props.xAxis.timeZone : 'UTC';
            const labels = timeTickLabels(splits.map((s) => s * 1000), incr * 1000, zone);
            // The labels as drawn, on the element, so a test can read what the canvas shows.
            host.dataset.timeTicks = labels.map((l) => l.replace('\n', ' ')).join(' | ');
            return labels;
          },
        }
      : { ...axis, label: props.xAxis.label, values: (_u, splits, _i, _s, incr) => splits.map((v) => (v == null ? '' : props.xAxis.kind === 'number' && props.xAxis.log ? String(Number(v.toPrecision(3))) : numberTickLabel(v, incr))) };
  const yAxis: uPlot.Axis = {
    ...axis,
    label: props.yLabel,
    size: 52,
    // uPlot leaves null in the splits of a log axis where it drops a crowded tick: no label there.
    values: (_u, splits, _i, _s, incr) => splits.map((v) => (v == null ? '' : props.logY ? String(Number(v.toPrecision(3))) : numberTickLabel(v, incr))),
  };
  const timeZone = props.xAxis.kind === 'time' ? props.xAxis.timeZone : undefined;
  const opts: uPlot.Options = {
    width: width_px,
    height: props.height,
    ...(timeZone ? { tzDate: (ts: number) => uPlot.tzDate(new Date(ts * 1000), timeZone) } : {}),
    cursor: { show: false, drag: { x: false, y: false, setScale: false } },
    legend: { show: false },
    scales: {
      x: props.xAxis.kind === 'time' ? { time: true } : { time: false, distr: props.xAxis.log ? 3 : 1 },
      y: props.logY ? { distr: 3 } : { range: (_u, min, max) => [Math.min(0, min), max > 0 ? max * 1.05 : 1] },
    },
    axes: [xAxis, yAxis],
    series: [
      {},
      ...props.series.map((s, i) => ({
        label: s.label,
        stroke: colourOf(s.colour, palette[i % palette.length]),
        width: s.width ?? 2,
        dash: s.dash,
        spanGaps: false,
        ...(s.points
          ? { paths: () => null, points: { show: true, size: 8, fill: colourOf(s.colour, palette[i % palette.length]) } }
          : { points: { show: false } }),
      })),
    ],
    bands: (props.bands ?? []).map((b) => ({ series: [b.upper + 1, b.lower + 1] as [number, number], fill: colourOf(b.fill, 'rgba(10,109,140,0.18)') })),
    hooks: {
      draw: [
        (u) => {
          if (!props.draw) return;
          const ratio = uPlot.pxRatio;
          u.ctx.save();
          props.draw({
            ctx: u.ctx,
            area: { left: u.bbox.left, top: u.bbox.top, width: u.bbox.width, height: u.bbox.height },
            ratio,
            xPos: (x) => u.valToPos(x / scale, 'x', true),
            yPos: (y) => u.valToPos(y, 'y', true),
            colour: cssVar,
          });
          u.ctx.restore();
        },
      ],
      setScale: [() => onView()],
      setSize: [() => onView()],
    },
  };
  const u = new uPlot(opts, dataOf(props), host);
  let view: XRange | undefined;
  const showView = (r: XRange | undefined) => {
    view = r;
    const e = extent();
    const shown = r ?? e;
    u.setScale('x', { min: shown.min, max: shown.max });
  };
  if (props.initialView) showView({ min: props.initialView.min / scale, max: props.initialView.max / scale });

  const geometry = (): PlotGeometry => {
    const ratio = uPlot.pxRatio;
    const left = u.bbox.left / ratio;
    const top = u.bbox.top / ratio;
    return {
      area: { left, top, width: u.bbox.width / ratio, height: u.bbox.height / ratio },
      xToPx: (x) => left + u.valToPos(x / scale, 'x'),
      yToPx: (y) => top + u.valToPos(y, 'y'),
      pxToX: (px) => u.posToVal(px - left, 'x') * scale,
      visible: { min: (u.scales.x.min ?? 0) * scale, max: (u.scales.x.max ?? 0) * scale },
    };
  };

  // Gestures on the plotting area: one pointer pans (or taps), two pinch, the wheel zooms about the cursor.
  const over = u.over;
  over.classList.add('plot-gestures');
  const pointers = new Map<number, { x: number; y: number }>();
  let gesture:
    | { kind: 'press'; id: number; x0: number; y0: number; range: XRange; moved: boolean }
    | { kind: 'pinch'; range: XRange; mid0: number; dist0: number }
    | undefined;
  const current = (): XRange => ({ min: u.scales.x.min ?? extent().min, max: u.scales.x.max ?? extent().max });
  const localX = (e: PointerEvent | WheelEvent) => e.clientX - over.getBoundingClientRect().left;
  const zoomOn = () => props.zoom !== false;
  const pinchState = () => {
    const [a, b] = [...pointers.values()];
    return { mid: (a.x + b.x) / 2, dist: Math.hypot(a.x - b.x, a.y - b.y) };
  };
  const down = (e: PointerEvent) => {
    if (e.button !== 0) return;
    pointers.set(e.pointerId, { x: localX(e), y: e.clientY });
    over.setPointerCapture?.(e.pointerId);
    if (pointers.size === 1) gesture = { kind: 'press', id: e.pointerId, x0: localX(e), y0: e.clientY, range: current(), moved: false };
    else if (pointers.size === 2 && zoomOn()) {
      const p = pinchState();
      gesture = { kind: 'pinch', range: current(), mid0: p.mid, dist0: p.dist };
    }
  };
  const move = (e: PointerEvent) => {
    if (!pointers.has(e.pointerId)) return;
    pointers.set(e.pointerId, { x: localX(e), y: e.clientY });
    if (!gesture) return;
    const width = over.clientWidth || 1;
    if (gesture.kind === 'press') {
      const dx = localX(e) - gesture.x0;
      if (!gesture.moved && Math.hypot(dx, e.clientY - gesture.y0) < TAP_SLOP_PX) return;
      gesture.moved = true;
      if (!zoomOn()) return;
      const r = gesture.range;
      showView(panBy(r, (-dx / width) * (r.max - r.min), extent()));
    } else if (pointers.size === 2) {
      const p = pinchState();
      showView(pinchRange(gesture.range, gesture.mid0, gesture.dist0, p.mid, p.dist, width, extent(), minSpan()));
    }
  };
  const up = (e: PointerEvent) => {
    if (!pointers.has(e.pointerId)) return;
    pointers.delete(e.pointerId);
    if (gesture?.kind === 'press' && !gesture.moved && e.type === 'pointerup' && props.onTap && xs.length > 0) {
      props.onTap(u.posToIdx(localX(e)));
    }
    // After a pinch, the finger left on the glass carries on as a pan from where the view is now.
    const rest = [...pointers.entries()][0];
    gesture = rest ? { kind: 'press', id: rest[0], x0: rest[1].x, y0: rest[1].y, range: current(), moved: true } : undefined;
  };
  const wheel = (e: WheelEvent) => {
    if (!zoomOn()) return;
    e.preventDefault();
    const r = current();
    const anchor = r.min + (localX(e) / (over.clientWidth || 1)) * (r.max - r.min);
    showView(zoomAbout(r, anchor, Math.pow(1.2, -e.deltaY / 100), extent(), minSpan()));
  };
  const dblclick = () => zoomOn() && showView(undefined);
  over.addEventListener('pointerdown', down);
  over.addEventListener('pointermove', move);
  over.addEventListener('pointerup', up);
  over.addEventListener('pointercancel', up);
  over.addEventListener('wheel', wheel, { passive: false });
  over.addEventListener('dblclick', dblclick);

  const api: PlotApi = {
    canvas: () => u.ctx.canvas,
    geometry,
    resetView: () => showView(undefined),
    flush: () => u.batch(() => u.redraw(false)),
  };

  return {
    api,
    update(next) {
      const xChanged = next.x !== props.x;
      const viewChanged = next.viewKey !== props.viewKey;
      if (next.logY !== props.logY) columns = new WeakMap();
      props = next;
      const keep = view;
      u.batch(() => {
        u.setData(dataOf(next), true);
        if (viewChanged && next.initialView) showView({ min: next.initialView.min / scale, max: next.initialView.max / scale });
        else if (viewChanged) showView(undefined);
        else if (keep && !xChanged) showView(keep);
        else if (keep) showView(clampRange(keep, extent()));
      });
    },
    setWidth(width_px) {
      u.setSize({ width: width_px, height: props.height });
    },
    destroy() {
      u.destroy();
    },
  };
}
