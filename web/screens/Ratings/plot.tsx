// The rating plot, a configuration of the shared Plot: stage up the side against discharge, arithmetic or
// log–log (stage above the zero-flow stage), the gauged range shaded, extrapolated parts dashed, the
// gaugings as numbered points (a cross through those that do not check the rating), tap for figures.
import { useCallback, useMemo, useRef, useState } from 'preact/hooks';
import { displayUnit, type GaugingRecord, type RatingRecord, type SiteRecord } from '../../../core';
import { Plot, type PlotApi, type PlotDrawView, type PlotSeries } from '../../components/Plot';
import { formatQuantity, formatTime } from '../../format';
import { ratingPlotData, type PlotScale } from './plot-data';

/** How far (CSS px across) a tap may land from a gauging and still pick it. */
const TAP_REACH_PX = 22;

/** The rating plot of one rating with the site's gaugings. */
export function RatingPlot({ site, rating, gaugings }: { site: SiteRecord; rating: RatingRecord; gaugings: readonly GaugingRecord[] }) {
  const u = site.displayUnits;
  const su = displayUnit('stage', u);
  const qu = displayUnit('discharge', u);
  const [scale, setScale] = useState<PlotScale>('arithmetic');
  const [picked, setPicked] = useState<number>();
  const data = useMemo(() => ratingPlotData(rating, gaugings, scale, u), [rating, gaugings, scale, u]);
  const series = useMemo<PlotSeries[]>(() => [
    { label: 'Rating, gauged range', values: data.gauged, colour: '--accent', width: 2.5 },
    { label: 'Rating, extrapolated', values: data.extrapolated, colour: '--accent', width: 2, dash: [6, 5] },
    { label: 'Gaugings', values: data.gaugings, colour: '--warn-line', points: true },
  ], [data]);
  const draw = useCallback((v: PlotDrawView) => {
    const { ctx, area, ratio } = v;
    if (data.band) {
      const y1 = v.yPos(data.band[1]);
      const y0 = v.yPos(data.band[0]);
      ctx.fillStyle = 'rgba(30,107,58,0.12)';
      ctx.fillRect(area.left, Math.max(area.top, y1), area.width, Math.min(area.top + area.height, y0) - Math.max(area.top, y1));
    }
    ctx.font = `${12 * ratio}px system-ui, sans-serif`;
    ctx.fillStyle = v.colour('--text', '#15191c');
    ctx.strokeStyle = v.colour('--bad-line', '#b3261e');
    ctx.lineWidth = 2 * ratio;
    for (const p of data.points) {
      const x = v.xPos(p.x);
      const y = v.yPos(p.y);
      if (!Number.isFinite(x) || !Number.isFinite(y) || x < area.left || x > area.left + area.width) continue;
      if (!p.checks) {
        const r = 6 * ratio;
        ctx.beginPath();
        ctx.moveTo(x - r, y - r);
        ctx.lineTo(x + r, y + r);
        ctx.moveTo(x + r, y - r);
        ctx.lineTo(x - r, y + r);
        ctx.stroke();
      }
      ctx.fillText(String(p.label), x + 6 * ratio, y - 6 * ratio);
    }
  }, [data]);
  const api = useRef<PlotApi | undefined>(undefined);
  const onApi = useCallback((a: PlotApi | undefined) => {
    api.current = a;
  }, []);
  const onTap = useCallback((i: number) => {
    const direct = data.gaugingAt[i];
    if (direct >= 0) return setPicked(direct);
    // The nearest gauging across the plot, when the tap lands within a finger's width of it.
    const g = api.current?.geometry();
    if (!g) return setPicked(undefined);
    const at = g.xToPx(data.x[i]);
    let best = -1;
    let gap = Infinity;
    data.points.forEach((p, k) => {
      const d = Math.abs(g.xToPx(p.x) - at);
      if (d < gap) {
        gap = d;
        best = k;
      }
    });
    setPicked(best >= 0 && gap <= TAP_REACH_PX ? best : undefined);
  }, [data]);
  const shown = picked !== undefined ? data.points[picked] : undefined;
  const yLabel = scale === 'log' ? `Stage above ${formatQuantity('stage', rating.segments[0].offset_m, u)} (${su})` : `Stage (${su})`;
  const fails = data.points.filter((p) => !p.checks).length;
  return (
    <section aria-labelledby="plot-heading">
      <h3 id="plot-heading">Rating plot</h3>
      <div class="row" role="group" aria-label="Axes">
        <button type="button" aria-pressed={scale === 'arithmetic'} onClick={() => setScale('arithmetic')}>Arithmetic</button>
        <button type="button" aria-pressed={scale === 'log'} onClick={() => setScale('log')}>Log–log</button>
      </div>
      <Plot
        className="rating-plot"
        x={data.x}
        xAxis={{ kind: 'number', label: `Discharge (${qu})`, log: scale === 'log' }}
        series={series}
        yLabel={yLabel}
        logY={scale === 'log'}
        height={300}
        draw={draw}
        onTap={onTap}
        onApi={onApi}
        viewKey={scale}
        description={`Rating curve, stage against discharge${scale === 'log' ? ' on log–log axes' : ''}, with ${data.points.length} gaugings numbered from the oldest; ${fails} do not check the rating within their grade and are crossed. The shaded band is the gauged range; dashed parts are extrapolated.`}
      />
      <p class="hint">Solid: within the gauged range (shaded); dashed: extrapolated. Gaugings are numbered from the oldest; a cross marks one that does not check the rating. Pinch or drag to zoom and pan; tap a gauging for its figures.</p>
      {shown && (
        <p class="callout" role="status" data-testid="plot-pick">
          Gauging {shown.label}: {formatTime(shown.gauging.time_ms, site.timeZone)}, {formatQuantity('stage', shown.gauging.meanStage_m, u)}, {formatQuantity('discharge', shown.gauging.discharge_m3s, u)}, {shown.gauging.grade}
          {shown.checks ? ', checks the rating.' : ', does not check the rating.'}
        </p>
      )}
    </section>
  );
}
