// The one chart component: a uPlot plot created once, given new data with setData and new widths with
// setSize, destroyed on unmount. Pinch or wheel zooms the x axis, a drag pans it, a tap reads out the
// nearest point, double-click shows everything again. uPlot loads with the first plot (lazy import).
import { useEffect, useRef, useState } from 'preact/hooks';
import type { PlotEngine } from './engine';
import type { PlotGeometry, PlotProps } from './types';
import './style.css';
import { plainError } from '../../plain-words';

export type { PlotApi, PlotBand, PlotDrawView, PlotGeometry, PlotProps, PlotSeries, PlotXAxis } from './types';

let engineModule: Promise<typeof import('./engine')> | undefined;
/** The uPlot side, loaded once on first use. */
function loadEngine(): Promise<typeof import('./engine')> {
  engineModule ??= import('./engine');
  return engineModule;
}

/** A plot filling its container's width; see PlotProps for what it draws and reports. */
export function Plot(props: PlotProps) {
  const box = useRef<HTMLDivElement>(null);
  const host = useRef<HTMLDivElement>(null);
  const engine = useRef<PlotEngine | undefined>(undefined);
  const latest = useRef(props);
  latest.current = props;
  const [shape, setShape] = useState<string>();
  const [geometry, setGeometry] = useState<PlotGeometry>();
  const [failed, setFailed] = useState<string>();

  useEffect(() => {
    let live = true;
    loadEngine().then(
      (m) => live && setShape(m.shapeKey(latest.current)),
      (e: unknown) => live && setFailed(plainError(e, { fallback: 'The plot could not be loaded. Reload the page and try again.' })),
    );
    return () => {
      live = false;
    };
  }, []);

  // Build (and rebuild when the structure changes); the engine module is loaded by then.
  useEffect(() => {
    if (shape === undefined) return;
    let live = true;
    let frame = 0;
    let built: PlotEngine | undefined;
    const el = host.current!;
    void loadEngine().then((m) => {
      if (!live) return;
      // Geometry is read after uPlot has drawn, once per animation frame at most.
      const onView = () => {
        if (frame || !built) return;
        frame = requestAnimationFrame(() => {
          frame = 0;
          if (live && built) setGeometry(built.api.geometry());
        });
      };
      built = m.createPlot(el, latest.current, el.clientWidth || 320, onView);
      engine.current = built;
      setGeometry(built.api.geometry());
      latest.current.onApi?.(built.api);
    });
    const resize = new ResizeObserver(() => {
      const w = el.clientWidth;
      if (built && w > 0) built.setWidth(w);
    });
    resize.observe(el);
    return () => {
      live = false;
      cancelAnimationFrame(frame);
      resize.disconnect();
      built?.destroy();
      if (engine.current === built) engine.current = undefined;
      latest.current.onApi?.(undefined);
    };
  }, [shape]);

  // A new structure rebuilds; new data of the same structure only replaces the data.
  useEffect(() => {
    if (shape === undefined) return;
    void loadEngine().then((m) => {
      const key = m.shapeKey(props);
      if (key !== shape) setShape(key);
      else engine.current?.update(props);
    });
  }, [props.x, props.series, props.bands, props.logY, props.yLabel, props.height, props.viewKey, props.draw, props.xAxis]);

  return (
    <figure class={props.className ? `plot ${props.className}` : 'plot'} ref={box}>
      <div class="plot-box">
        <div ref={host} class="plot-host" role="img" aria-label={props.description} />
        {geometry && props.overlay && <div class="plot-overlay">{props.overlay(geometry)}</div>}
      </div>
      {failed && <p class="callout bad" role="alert">The plot could not be drawn: {failed}</p>}
      {shape === undefined && !failed && <p class="muted plot-loading">Drawing the plot…</p>}
    </figure>
  );
}
