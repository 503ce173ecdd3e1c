// The analysis of the storm screen's window: its stage record with discharge, one discharge per time,
// the key points (found or moved), the chosen method's baseflow and figures, every method side by side,
// the rating's standard error, the runoff range and the extrapolation flags. Numbers come from core.
import { useMemo } from 'preact/hooks';
import { displayUnit, fromDisplay, type SiteRecord } from '../../../core';
import { listRatings, seriesWithDischarge } from '../../db';
import { useRecords } from '../../components/use-records';
import { parseDecimal } from '../../format';
import { analyse, findPoints, seriesFromReadings } from './analysis';
import type { StormDraft, TimeWindow } from './draft';
import { nearestIndex } from './key-point-order';
import { methodFor } from './method-choice';
import { everyMethod, methodSpread } from './method-table';
import { stormRange } from './runoff-range';

/** Everything the storm screen shows about its window, derived from the stored records and the draft. */
export function useStormAnalysis(site: SiteRecord, draft: StormDraft, win: TimeWindow | undefined) {
  const area = site.area_km2;
  const units = site.displayUnits;
  const rows = useRecords(
    async () => (win ? seriesWithDischarge(site.id, win.from_ms, win.to_ms) : undefined),
    ['reading', 'logger-day', 'rating'],
    [site.id, win?.from_ms, win?.to_ms],
  );
  const ratings = useRecords(() => listRatings(site.id), ['rating'], [site.id]);
  const made = useMemo(() => (rows.state === 'ready' && rows.value ? seriesFromReadings(rows.value) : undefined), [rows]);
  const series = made?.kind === 'ready' ? made.series : undefined;
  const found = useMemo(() => (series ? findPoints(series, area) : undefined), [series, area]);
  const foundPoints = found?.ok ? found.value.points : undefined;
  const points = draft.points ?? foundPoints;

  const rain = useMemo((): { mm?: number; problem?: string } => {
    if (draft.rainfall.trim() === '') return {};
    const v = parseDecimal(draft.rainfall);
    if (v === undefined || !(v > 0)) {
      return { problem: `Rainfall needs a number above 0 in ${displayUnit('depth', units)}; "${draft.rainfall.trim()}" cannot be read as one.` };
    }
    return { mm: fromDisplay('depth', v, units) };
  }, [draft.rainfall, units]);
  const rainfall_mm = area === undefined ? undefined : rain.mm;

  const madeMethod = useMemo(() => methodFor(draft.method, area), [draft.method, area]);
  const method = 'method' in madeMethod ? madeMethod.method : undefined;
  const result = useMemo(
    () => (series && points && method ? analyse(series, points, method, area, rainfall_mm) : undefined),
    [series, points, method, area, rainfall_mm],
  );
  const all = useMemo(() => (series && points ? everyMethod(series, points, area, draft.method) : undefined), [series, points, area, draft.method]);
  const spread = useMemo(() => (all ? methodSpread(all) : undefined), [all]);

  // The rating behind the peak reading gives the standard error; a rating without fit statistics has none (the range states its default).
  const se = useMemo((): { pct?: number } | undefined => {
    const window = rows.state === 'ready' ? rows.value : undefined;
    if (!window || !series || !points || ratings.state !== 'ready') return undefined;
    const at = nearestIndex(window.time_ms, points.peak_ms);
    const id = window.ratingIds[window.ratingIndex[at]];
    const pct = ratings.value.find((r) => r.id === id)?.fit?.standardError_pct;
    return pct === undefined ? {} : { pct };
  }, [rows, series, points, ratings]);
  const range = useMemo(
    () => (series && points && result?.ok && all && se ? stormRange(series, points, result.value, all, se.pct, area) : undefined),
    [series, points, result, all, se, area],
  );
  const flags = useMemo(() => {
    if (!series || !points) return { peak: false, volume: false };
    const a = nearestIndex(series.time_ms, points.riseStart_ms);
    const b = nearestIndex(series.time_ms, points.runoffEnd_ms);
    let any = false;
    for (let i = a; i <= b; i++) any ||= series.extrapolated[i] === 1;
    return { peak: series.extrapolated[nearestIndex(series.time_ms, points.peak_ms)] === 1, volume: any };
  }, [series, points]);

  return { rows, made, series, found, foundPoints, points, rain, rainfall_mm, madeMethod, method, result, all, spread, se, range, flags };
}

/** What useStormAnalysis gives. */
export type StormAnalysis = ReturnType<typeof useStormAnalysis>;
