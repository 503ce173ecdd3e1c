// What the rating plot shows, as plain arrays: the curve (gauged part solid, extrapolated parts dashed)
// and the gaugings as points, on one ascending discharge axis (display units), stage up the side.
// Arithmetic, or log–log with stage measured above the zero-flow stage. Pure: no DOM.
import { dischargeAt, gaugingCheck, stageAt, toDisplay, type DatedRating, type GaugingRecord, type UnitSystem } from '../../../core';

/** Arithmetic axes, or log–log of discharge against stage minus the offset. */
export type PlotScale = 'arithmetic' | 'log';

/** The plot's columns: x discharge (display units, ascending), y stage (display units; above the offset on log). */
export interface RatingPlotData {
  x: number[];
  gauged: number[];
  extrapolated: number[];
  gaugings: number[];
  /** For each x index, the gauging drawn there (index into `points`), or −1. */
  gaugingAt: number[];
  /**
   * The gaugings shown, oldest first, with their plotted y, their number (1 = oldest) and whether they check
   * the rating: core's gaugingCheck, with the shift in force at each gauging's time (as the gauging list says).
   */
  points: { gauging: GaugingRecord; x: number; y: number; label: number; checks: boolean }[];
  /** The gauged range of stage in plotted y units, if the rating has one. */
  band?: [number, number];
  /** The offset (display units) subtracted from the stage on log axes; 0 on arithmetic ones. */
  offset: number;
}

/** Curve samples along the stage. */
const SAMPLES = 160;

/**
 * Builds the plot's columns for `rating` and the gaugings: curve sampled evenly in stage (in ln(h − e)
 * on log axes) from just above the zero-flow stage, or the lowest gauged or gauging stage, to 20 % past
 * the highest; gauging x values merged in, with the curve's stage there from stageAt so lines stay whole.
 */
export function ratingPlotData(rating: DatedRating, gaugings: readonly GaugingRecord[], scale: PlotScale, units: UnitSystem): RatingPlotData {
  const e = rating.segments[0].offset_m;
  const range = rating.gaugedRange_m;
  const stages = gaugings.map((g) => g.meanStage_m);
  const top = Math.max(range ? range[1] : -Infinity, ...stages, rating.segments[rating.segments.length - 1].fromStage_m, e + 0.1);
  const span = top - e;
  const hi = top + 0.2 * span;
  const lowest = Math.min(range ? range[0] : Infinity, ...stages, top);
  // On log axes the curve starts a third of the way from the offset to the lowest stage of interest.
  const lo = scale === 'log' ? e + Math.max(1e-3 * span, (lowest - e) / 3) : Math.max(e, lowest - 0.3 * span);
  const curveStages: number[] = [];
  for (let k = 0; k <= SAMPLES; k++) {
    const f = k / SAMPLES;
    curveStages.push(scale === 'log' ? e + Math.exp(Math.log(lo - e) + f * (Math.log(hi - e) - Math.log(lo - e))) : lo + f * (hi - lo));
  }
  const q = (m3s: number) => toDisplay('discharge', m3s, units);
  const offset = scale === 'log' ? toDisplay('stage', e, units) : 0;
  const y = (stage_m: number) => toDisplay('stage', stage_m, units) - offset;
  const shown = [...gaugings].filter((g) => scale === 'arithmetic' || (g.discharge_m3s > 0 && g.meanStage_m > e)).sort((a, b) => a.time_ms - b.time_ms);
  const entries: { x: number; stage_m: number; point: number }[] = [];
  for (const h of curveStages) {
    const Q = dischargeAt(rating, h);
    if (scale === 'log' && !(Q > 0)) continue;
    entries.push({ x: q(Q), stage_m: h, point: -1 });
  }
  const points = shown.map((g, i) => {
    const checks = gaugingCheck(g, [rating])?.checks ?? false;
    entries.push({ x: q(g.discharge_m3s), stage_m: stageAt(rating, g.discharge_m3s), point: i });
    return { gauging: g, x: q(g.discharge_m3s), y: y(g.meanStage_m), label: i + 1, checks };
  });
  entries.sort((a, b) => a.x - b.x || a.point - b.point);
  const out: RatingPlotData = { x: [], gauged: [], extrapolated: [], gaugings: [], gaugingAt: [], points, offset };
  const inRange = (h: number) => !range || (h >= range[0] - 1e-9 && h <= range[1] + 1e-9);
  for (let i = 0; i < entries.length; i++) {
    const en = entries[i];
    const yc = y(en.stage_m);
    const inside = inRange(en.stage_m);
    // A curve point next to the other kind is drawn in both, so the solid and dashed parts meet.
    const prevIn = i > 0 ? inRange(entries[i - 1].stage_m) : inside;
    const nextIn = i + 1 < entries.length ? inRange(entries[i + 1].stage_m) : inside;
    out.x.push(en.x);
    out.gauged.push(inside || prevIn || nextIn ? yc : Number.NaN);
    out.extrapolated.push(!inside || !prevIn || !nextIn ? yc : Number.NaN);
    out.gaugings.push(en.point >= 0 ? points[en.point].y : Number.NaN);
    out.gaugingAt.push(en.point);
  }
  if (range) out.band = [y(range[0]), y(range[1])];
  return out;
}
