// A hydrograph: one or more lines of discharge (or stage) against time, as a configuration of the shared
// Plot (which owns uPlot). Times in UTC ms, labelled in the site's zone.
import { useCallback, useMemo } from 'preact/hooks';
import { Plot, type PlotDrawView, type PlotSeries } from '../Plot';

/** One line on the plot: values in display units, aligned with the plot's times. */
export interface PlotLine {
  label: string;
  values: ArrayLike<number>;
  /** CSS colour or theme variable name; the theme's colours are used when omitted. */
  colour?: string;
  dash?: number[];
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
  /** Optional vertical lines at given times. */
  markers?: PlotMarker[];
}

/** Draws markers as dashed vertical lines with their labels; labels that would touch move down a row. */
export function drawMarkers(view: PlotDrawView, markers: readonly PlotMarker[]): void {
  const { ctx, area, ratio } = view;
  ctx.strokeStyle = view.colour('--muted', '#4a5358');
  ctx.fillStyle = view.colour('--text', '#15191c');
  ctx.lineWidth = 1.5 * ratio;
  ctx.setLineDash([4 * ratio, 3 * ratio]);
  ctx.font = `600 ${12 * ratio}px system-ui, sans-serif`;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'top';
  const row = 14 * ratio;
  const placed: { x: number; row: number }[] = [];
  for (const m of [...markers].sort((a, b) => a.time_ms - b.time_ms)) {
    const x = view.xPos(m.time_ms);
    if (!Number.isFinite(x) || x < area.left || x > area.left + area.width) continue;
    const half = (ctx.measureText(m.label).width / 2) + 3 * ratio;
    let r = 0;
    while (placed.some((p) => p.row === r && Math.abs(p.x - x) < 2 * half)) r++;
    placed.push({ x, row: r });
    ctx.beginPath();
    ctx.moveTo(x, area.top + (r + 1) * row);
    ctx.lineTo(x, area.top + area.height);
    ctx.stroke();
    ctx.fillText(m.label, x, area.top + r * row);
  }
}

/** A hydrograph plot that fills its container's width. */
export function Hydrograph(props: HydrographProps) {
  const series = useMemo<PlotSeries[]>(
    () => props.lines.map((l) => ({ label: l.label, values: l.values, colour: l.colour, dash: l.dash })),
    [props.lines],
  );
  const xAxis = useMemo(() => ({ kind: 'time' as const, timeZone: props.timeZone }), [props.timeZone]);
  const markers = props.markers;
  const draw = useCallback((view: PlotDrawView) => markers && drawMarkers(view, markers), [markers]);
  return (
    <Plot
      x={props.time_ms}
      xAxis={xAxis}
      series={series}
      yLabel={props.yLabel}
      logY={props.logScale}
      height={props.height ?? 200}
      description={props.description}
      draw={draw}
      className="hydrograph"
    />
  );
}
