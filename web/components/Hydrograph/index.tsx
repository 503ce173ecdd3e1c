// The one uPlot wrapper: a hydrograph of one or more lines against time. Created once, fed with
// setData/setSize on change, destroyed on unmount. Times in, as everywhere, UTC ms; uPlot wants seconds.
import { useEffect, useRef } from 'preact/hooks';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import './style.css';

/** One line on the plot: values in display units, aligned with the plot's times. */
export interface PlotLine {
  label: string;
  values: ArrayLike<number>;
  /** CSS colour; the theme's colours are read from CSS variables when omitted. */
  colour?: string;
  dash?: number[];
  fill?: string;
}

/** A labelled vertical line at a time (UTC ms), e.g. a key point of a storm event. */
export interface PlotMarker {
  time_ms: number;
  /** A short label drawn at the top of the line (one or two characters read best). */
  label: string;
}

/** Props: times (UTC ms), lines, the y-axis label with its unit, the site's zone, height in CSS px. */
export interface HydrographProps {
  time_ms: ArrayLike<number>;
  lines: PlotLine[];
  yLabel: string;
  timeZone: string;
  height?: number;
  /** Log-scale y axis (recessions are straight on it); values ≤ 0 are left out. */
  logScale?: boolean;
  /** Text for screen readers, summarising what the plot shows. */
  description: string;
  /** Optional vertical lines at given times; changing them redraws without rebuilding the plot. */
  markers?: PlotMarker[];
}

function cssVar(name: string, fallback: string): string {
  const v = getComputedStyle(document.documentElement).getPropertyValue(name).trim();
  return v || fallback;
}

function toData(props: HydrographProps): uPlot.AlignedData {
  const xs = Float64Array.from(props.time_ms, (t) => t / 1000);
  const ys = props.lines.map((l) =>
    Array.from(l.values, (v) => (Number.isFinite(v) && (!props.logScale || v > 0) ? v : null)),
  );
  return [xs as unknown as number[], ...ys];
}

/** Draws the markers as dashed vertical lines with their labels, in canvas pixels. */
function drawMarkers(u: uPlot, markers: readonly PlotMarker[] | undefined): void {
  if (!markers || markers.length === 0) return;
  const { ctx, bbox } = u;
  const px = uPlot.pxRatio;
  ctx.save();
  ctx.strokeStyle = cssVar('--muted', '#4a5358');
  ctx.fillStyle = cssVar('--text', '#15191c');
  ctx.lineWidth = 1.5 * px;
  ctx.setLineDash([4 * px, 3 * px]);
  ctx.font = `600 ${12 * px}px system-ui, sans-serif`;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'top';
  for (const m of markers) {
    const x = u.valToPos(m.time_ms / 1000, 'x', true);
    if (!Number.isFinite(x) || x < bbox.left || x > bbox.left + bbox.width) continue;
    ctx.beginPath();
    ctx.moveTo(x, bbox.top + 14 * px);
    ctx.lineTo(x, bbox.top + bbox.height);
    ctx.stroke();
    ctx.fillText(m.label, x, bbox.top);
  }
  ctx.restore();
}

function makeOptions(props: HydrographProps, width: number, markers: () => PlotMarker[] | undefined): uPlot.Options {
  const text = cssVar('--text', '#15191c');
  const grid = cssVar('--line', '#c9c4b8');
  const palette = [cssVar('--accent', '#0a6d8c'), cssVar('--warn-line', '#a15c00'), cssVar('--bad-line', '#b3261e')];
  const axis = { stroke: text, grid: { stroke: grid, width: 1 }, ticks: { stroke: grid, width: 1 } };
  return {
    width,
    height: props.height ?? 200,
    tzDate: (ts) => uPlot.tzDate(new Date(ts * 1000), props.timeZone),
    cursor: { drag: { x: false, y: false } },
    hooks: { draw: [(u) => drawMarkers(u, markers())] },
    legend: { show: true, live: true },
    scales: { x: { time: true }, y: props.logScale ? { distr: 3 } : { range: (_u, min, max) => [Math.min(0, min), max > 0 ? max * 1.05 : 1] } },
    axes: [{ ...axis }, { ...axis, label: props.yLabel, size: 56 }],
    series: [
      {},
      ...props.lines.map((l, i) => ({
        label: l.label,
        stroke: l.colour ?? palette[i % palette.length],
        width: 2,
        dash: l.dash,
        fill: l.fill,
        points: { show: false },
        spanGaps: false,
      })),
    ],
  };
}

/** A hydrograph plot that fills its container's width. */
export function Hydrograph(props: HydrographProps) {
  const host = useRef<HTMLDivElement>(null);
  const plot = useRef<uPlot | undefined>(undefined);
  // Read by the draw hook, so new markers need only a redraw, not a new plot.
  const markers = useRef(props.markers);
  markers.current = props.markers;
  const shape = `${props.lines.map((l) => l.label).join('|')}|${props.yLabel}|${props.logScale}|${props.timeZone}`;
  useEffect(() => {
    const el = host.current!;
    const u = new uPlot(makeOptions(props, el.clientWidth || 320, () => markers.current), toData(props), el);
    plot.current = u;
    const resize = new ResizeObserver(() => u.setSize({ width: el.clientWidth || 320, height: props.height ?? 200 }));
    resize.observe(el);
    return () => {
      resize.disconnect();
      u.destroy();
      plot.current = undefined;
    };
  }, [shape]);
  useEffect(() => {
    plot.current?.setData(toData(props));
  }, [props.time_ms, props.lines]);
  useEffect(() => {
    plot.current?.redraw(false);
  }, [props.markers]);
  return (
    <figure class="hydrograph">
      <div ref={host} role="img" aria-label={props.description} />
    </figure>
  );
}
