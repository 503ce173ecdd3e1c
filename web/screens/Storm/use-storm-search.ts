// The storms of a site's recent record for the storm list: the stage record of the last SEARCH_DAYS days
// up to its latest value (spot readings and logger values), one discharge per time, and core's findStorms
// (continuous stretches only), with the method the screen opens a storm with, so the list's figures are
// the opened analysis's figures.
import { useMemo } from 'preact/hooks';
import { findStorms, type SeparationMethod, type SiteRecord } from '../../../core';
import { latestStageTime, seriesWithDischarge } from '../../db';
import { useRecords } from '../../components/use-records';
import { seriesFromReadings } from './analysis';
import { defaultMethodChoice, methodFor } from './method-choice';

const DAY_MS = 86_400_000;
/** Days of record searched for storms, up to the latest value of the record. */
export const SEARCH_DAYS = 60;

/** The method a storm opens with (the screen's first choice), as a core method. */
export function openingMethod(area_km2: number | undefined): SeparationMethod {
  const made = methodFor(defaultMethodChoice, area_km2);
  if (!('method' in made)) throw new Error('The first method choice must always be usable.');
  return made.method;
}

/** The latest time of the site's record (loading, none or UTC ms) and the storms found before it. */
export function useStormSearch(site: SiteRecord) {
  const area = site.area_km2;
  const latest = useRecords(() => latestStageTime(site.id), ['reading', 'logger-day'], [site.id]);
  const last_ms = latest.state === 'ready' ? latest.value : undefined;
  const searched = useRecords(
    async () => (last_ms === undefined ? undefined : seriesWithDischarge(site.id, last_ms - SEARCH_DAYS * DAY_MS, last_ms)),
    ['reading', 'logger-day', 'rating'],
    [site.id, last_ms],
  );
  const searchMade = useMemo(() => (searched.state === 'ready' && searched.value ? seriesFromReadings(searched.value) : undefined), [searched]);
  const storms = useMemo(
    () => (searchMade?.kind === 'ready' ? findStorms(searchMade.series, { area_km2: area, method: openingMethod(area) }) : undefined),
    [searchMade, area],
  );
  return { latest, last_ms, searchMade, storms };
}
