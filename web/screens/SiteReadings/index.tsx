// One site's readings: newest first with stage and discharge in the site's units, flags for warnings
// and extrapolation, edit and delete (with undo), and a small hydrograph of the last days.
import { useMemo, useState } from 'preact/hooks';
import type { SiteRecord } from '../../../core';
import {
  deleteReading, getSite, listGaugings, ratingInForceAt, restoreReading, seriesWithDischarge, stageRecordIn, type ReadingWithDischarge,
} from '../../db';
import { listItems, type ListItem } from './list-items';
import { LoggerDayRow, ReadingRow } from './rows';
import { useRecords } from '../../components/use-records';
import { Hydrograph } from '../../components/Hydrograph';
import { formatQuantity, formatTime } from '../../format';
import { href, type ScreenProps } from '../../router';
import { displayUnit, hasDischarge, MS_PER_DAY, toDisplay } from '../../../core';
import './style.css';
import { plainError } from '../../plain-words';
import { Photos } from '../../components/Photos';

/** How many days the small hydrograph shows, ending at the latest reading. */
const PLOT_DAYS = 7;
const PAGE = 50;

interface SiteView {
  site: SiteRecord;
  /** Spot readings one each, the logger record one item per logger day; newest first. */
  items: ListItem[];
  last_ms: number | undefined;
  ratingNote?: string;
  gaugingCount: number;
}

async function readSite(siteId: string, days: number): Promise<SiteView | undefined> {
  const site = await getSite(siteId);
  if (!site) return undefined;
  const now = Date.now();
  // Readings of the last `days` days and every reading with a time ahead of the clock, however far
  // (a mistyped year must stay reachable so it can be fixed).
  const record = await stageRecordIn(siteId, now - days * MS_PER_DAY, Infinity);
  const items = listItems(record);
  const last_ms = record.time_ms.length > 0 ? record.time_ms[record.time_ms.length - 1] : undefined;
  const rating = await ratingInForceAt(siteId, now);
  const gaugings = await listGaugings(siteId);
  const ratingNote = rating
    ? `Rating in force since ${formatTime(rating.validFrom_ms, site.timeZone)}: ${rating.segments.length} segment${rating.segments.length > 1 ? 's' : ''}` +
      (rating.gaugedRange_m ? `, gauged from ${formatQuantity('stage', rating.gaugedRange_m[0], site.displayUnits)} to ${formatQuantity('stage', rating.gaugedRange_m[1], site.displayUnits)}` : '') +
      (rating.shifts.length ? `, ${rating.shifts.length} dated shift${rating.shifts.length > 1 ? 's' : ''}` : '')
    : undefined;
  return { site, items, last_ms, ratingNote, gaugingCount: gaugings.length };
}

/** The discharge of the PLOT_DAYS days up to the latest reading (last_ms, UTC ms), read as the compact series. */
function SmallPlot({ site, last_ms }: { site: SiteRecord; last_ms: number | undefined }) {
  const series = useRecords(
    () => (last_ms === undefined ? Promise.resolve(undefined) : seriesWithDischarge(site.id, last_ms - PLOT_DAYS * MS_PER_DAY, last_ms)),
    ['reading', 'logger-day', 'rating'],
    [site.id, last_ms],
  );
  const data = useMemo(() => {
    if (series.state !== 'ready' || !series.value) return undefined;
    const { time_ms, discharge_m3s } = series.value;
    const times: number[] = [];
    const values: number[] = [];
    for (let i = 0; i < time_ms.length; i++) {
      // A reading with no rating in force has no discharge to plot.
      if (!hasDischarge(discharge_m3s[i])) continue;
      times.push(time_ms[i]);
      values.push(toDisplay('discharge', discharge_m3s[i], site.displayUnits));
    }
    return times.length < 2 ? undefined : { time_ms: times, values };
  }, [series, site.displayUnits]);
  if (!data) return null;
  const unit = displayUnit('discharge', site.displayUnits);
  const peak = Math.max(...data.values);
  return (
    <Hydrograph
      time_ms={data.time_ms}
      lines={[{ label: `Discharge (${unit})`, values: data.values }]}
      yLabel={unit}
      timeZone={site.timeZone}
      height={170}
      description={`Discharge over the last ${PLOT_DAYS} days of readings: ${data.values.length} points, highest ${peak.toPrecision(3)} ${unit}.`}
    />
  );
}

/** The readings screen of one site. */
export default function SiteReadings({ params }: ScreenProps) {
  const siteId = params.siteId;
  const [days, setDays] = useState(30);
  const [shown, setShown] = useState(PAGE);
  const [undo, setUndo] = useState<{ id: string; text: string }>();
  const [message, setMessage] = useState<string>();
  const view = useRecords(() => readSite(siteId, days), ['site', 'reading', 'logger-day', 'rating', 'gauging'], [siteId, days]);
  if (view.state === 'loading') return <p aria-busy="true">Reading the site…</p>;
  if (view.state === 'failed') return <p class="callout bad" role="alert">The site could not be read: {view.message}</p>;
  if (!view.value) {
    return (
      <>
        <h2 id="screen-title" tabIndex={-1}>Site not found</h2>
        <p>This site is not on this phone (it may have been deleted). <a href={href('sites')}>Back to the sites</a></p>
      </>
    );
  }
  const { site, items, last_ms, ratingNote, gaugingCount } = view.value;
  const u = site.displayUnits;
  const now = Date.now();

  async function remove(r: ReadingWithDischarge) {
    try {
      await deleteReading(r.reading.id);
      setUndo({ id: r.reading.id, text: `Reading of ${formatQuantity('stage', r.reading.stage_m, u)} at ${formatTime(r.reading.time_ms, site.timeZone)} deleted.` });
    } catch (err) {
      setMessage(plainError(err, { doing: 'save', units: u, timeZone: site.timeZone }));
    }
  }

  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>{site.name}</h2>
      <p class="muted">
        {site.code}
        {site.area_km2 !== undefined && ` · ${formatQuantity('area', site.area_km2, u)}`} · {site.timeZone}
      </p>
      <div class="row">
        <a class="button primary" href={href('record', site.id)}>Record a reading</a>
        <a class="button" href={href('storm', site.id)}>Storm runoff</a>
        <a class="button" href={href('sites', site.id, 'edit')}>Edit site</a>
      </div>
      <p class={ratingNote ? 'callout' : 'callout warn'}>
        {ratingNote ?? 'No rating yet: readings are kept as stage only until a rating is added.'}{' '}
        <a href={href('sites', site.id, 'ratings')}>{ratingNote ? 'Ratings and shifts' : 'Add a rating'}</a>
        {' · '}
        <a href={href('sites', site.id, 'gaugings')}>{`${gaugingCount} gauging${gaugingCount === 1 ? '' : 's'} on this phone`}</a>
      </p>
      <SmallPlot site={site} last_ms={last_ms} />
      {message && <p class="callout bad" role="alert">{message}</p>}
      {undo && (
        <div class="notice" role="status">
          <p>{undo.text}</p>
          <button
            type="button"
            onClick={async () => {
              await restoreReading(undo.id);
              setUndo(undefined);
            }}
          >
            Undo
          </button>
          <button type="button" onClick={() => setUndo(undefined)} aria-label="Dismiss">OK</button>
        </div>
      )}
      <h3>Readings, newest first</h3>
      <p class="hint">The logger record shows one row per day; open a day for its range and drift corrections.</p>
      {items.length === 0 ? (
        <p>No readings in the last {days} days.</p>
      ) : (
        <ul class="list card" aria-label={`Readings of ${site.name}`}>
          {items.slice(0, shown).map((item) => (
            item.kind === 'reading'
              ? <ReadingRow key={item.key} r={item.row} site={site} now={now} onDelete={(r) => void remove(r)} />
              : <LoggerDayRow key={item.key} day={item} site={site} />
          ))}
        </ul>
      )}
      <div class="row">
        {items.length > shown && <button type="button" onClick={() => setShown(shown + PAGE)}>Show {Math.min(PAGE, items.length - shown)} more</button>}
        <button type="button" onClick={() => setDays(days * 3)}>Show older readings (last {days * 3} days)</button>
      </div>
      <Photos siteId={site.id} owner={{ kind: 'site', id: site.id }} timeZone={site.timeZone} />
    </>
  );
}
