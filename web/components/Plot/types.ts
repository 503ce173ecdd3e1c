// The Plot component's public types, apart from uPlot's so screens never depend on the chart library.
import type { ComponentChildren } from 'preact';

/** One series on a plot: values in display units aligned with the plot's x values; non-finite values are gaps. */
export interface PlotSeries {
  label: string;
  values: ArrayLike<number>;
  /** CSS colour, or the name of a theme variable such as '--accent'. */
  colour?: string;
  /** Line width in CSS px (default 2). */
  width?: number;
  /** Dash pattern in CSS px. */
  dash?: number[];
  /** Draw the values as dots (e.g. gaugings) instead of a line. */
  points?: boolean;
}

/** A filled area between two series (indexes into `series`), e.g. direct runoff between discharge and baseflow. */
export interface PlotBand {
  upper: number;
  lower: number;
  /** CSS colour of the fill (with alpha), or a theme variable name. */
  fill: string;
}

/** The x axis: times (UTC ms, labelled in the site's zone, 24-hour) or plain numbers with a label and unit. */
export type PlotXAxis = { kind: 'time'; timeZone: string } | { kind: 'number'; label: string; log?: boolean };

/** Where things are on the plot, in CSS px from the top-left of the plot's box (its host element). */
export interface PlotGeometry {
  /** The plotting area inside the box: left, top, width and height in CSS px. */
  area: { left: number; top: number; width: number; height: number };
  /** CSS px from the box's left edge for an x value (UTC ms on time axes). */
  xToPx(x: number): number;
  /** CSS px from the box's top edge for a y value in display units. */
  yToPx(y: number): number;
  /** The x value (UTC ms on time axes) at CSS px from the box's left edge. */
  pxToX(px: number): number;
  /** The visible x range (UTC ms on time axes). */
  visible: { min: number; max: number };
}

/** Drawing extras on the plot's canvas after the series are drawn: positions in canvas px (CSS px × ratio). */
export interface PlotDrawView {
  ctx: CanvasRenderingContext2D;
  /** The plotting area in canvas px. */
  area: { left: number; top: number; width: number; height: number };
  /** Canvas px per CSS px. */
  ratio: number;
  /** Canvas px of an x value (UTC ms on time axes). */
  xPos(x: number): number;
  /** Canvas px of a y value in display units. */
  yPos(y: number): number;
  /** A theme colour by CSS variable name, with a fallback. */
  colour(name: string, fallback: string): string;
}

/** What a screen can ask of a plot once it is drawn. */
export interface PlotApi {
  /** The plot's canvas as drawn now (axes, series, extras), for pictures. */
  canvas(): HTMLCanvasElement;
  /** The plot's current geometry. */
  geometry(): PlotGeometry;
  /** Shows the whole x range again after zooming or panning. */
  resetView(): void;
  /** Draws the latest data now instead of at the end of the current task (for timing and pictures). */
  flush(): void;
}

/** Props of the generic plot. */
export interface PlotProps {
  /** x values, ascending (UTC ms on a time axis). */
  x: ArrayLike<number>;
  xAxis: PlotXAxis;
  series: PlotSeries[];
  bands?: PlotBand[];
  /** The y axis label with its unit. */
  yLabel: string;
  /** Log-scale y axis (values ≤ 0 are left out). */
  logY?: boolean;
  /** Height in CSS px; the width follows the container. */
  height: number;
  /** Text for screen readers summarising what the plot shows. */
  description: string;
  /** Pinch/wheel zoom and drag pan of the x axis (default true). */
  zoom?: boolean;
  /** The x range to show when the plot is built or when `viewKey` changes (default: all). */
  initialView?: { min: number; max: number };
  /** Changing this key shows initialView again. */
  viewKey?: string;
  /** Called with the index of the nearest x value when the plot is tapped or clicked without moving. */
  onTap?: (index: number) => void;
  /** Extras drawn on the canvas after the series (markers, labels). */
  draw?: (view: PlotDrawView) => void;
  /** DOM drawn over the plot (e.g. draggable handles), re-rendered when the view changes. */
  overlay?: (geometry: PlotGeometry) => ComponentChildren;
  /** Extra class names on the plot's figure (e.g. 'hydrograph'). */
  className?: string;
  /** Receives the plot's API once it is drawn (and undefined when it is destroyed). */
  onApi?: (api: PlotApi | undefined) => void;
}
