// Export a site's data for the office: CSV tables (readings, gaugings, ratings) or WaterML 2.0 (Part 1
// time series, Part 2 ratings and gaugings), shared from the phone or downloaded.
import { useEffect, useState } from 'preact/hooks';
import {
  fromLocalInput, gaugingsToCsv, photoFilesByOwner, gaugingVerticalsToCsv, MS_PER_DAY, ratingSegmentsToCsv, ratingTablesToCsv, readingsToCsv, stageExportRows, toLocalInput, watermlRatings, watermlTimeseries,
  type SiteRecord,
} from '../../../core';
import { latestStageTime, listGaugings, listPhotosAtSite, listRatings, stageRecordIn } from '../../db';
import { describedBy, Field } from '../../components/Field';
import { saveTextFile } from '../../save-file';

/** What can be exported, with the label the screen shows and whether it reads the window of readings. */
const KINDS = {
  'readings-csv': { label: 'Readings with discharge (CSV)', windowed: true },
  'timeseries-waterml': { label: 'Stage and discharge series (WaterML 2.0 Part 1)', windowed: true },
  'ratings-waterml': { label: 'Ratings and gaugings (WaterML 2.0 Part 2)', windowed: false },
  'gaugings-csv': { label: 'Gaugings (CSV)', windowed: false },
  'verticals-csv': { label: 'Gauging verticals (CSV)', windowed: false },
  'rating-segments-csv': { label: 'Rating equations (CSV)', windowed: false },
  'rating-tables-csv': { label: 'Rating tables (CSV)', windowed: false },
} as const;
type ExportKind = keyof typeof KINDS;

interface Made {
  text: string;
  name: string;
  type: string;
  what: string;
}

/** The export card: site, what to export, the time window for readings, and Download / Share. */
export function ExportSection({ sites }: { sites: SiteRecord[] }) {
  const [siteId, setSiteId] = useState(sites[0]?.id ?? '');
  const [kind, setKind] = useState<ExportKind>('readings-csv');
  const site = sites.find((s) => s.id === siteId) ?? sites[0];
  const [range, setRange] = useState<{ from: string; to: string }>();
  const [status, setStatus] = useState<{ ok: boolean; text: string }>();
  const [busy, setBusy] = useState(false);
  // Default window: the 30 days up to the latest value of the site's record (spot reading or logger value).
  useEffect(() => {
    if (!site) return;
    void latestStageTime(site.id).then((latest) => {
      const end = latest ?? Date.now();
      setRange({ from: toLocalInput(end - 30 * MS_PER_DAY, site.timeZone), to: toLocalInput(end + 60_000, site.timeZone) });
    });
  }, [site?.id]);
  if (!site) return null;
  const stem = site.code.replace(/[^\w.-]+/g, '_');

  async function make(): Promise<Made | string> {
    // A site with photos: the CSV tables end with a photos column naming each record's photo files, as the
    // office's `freshet csv` and `freshet photos` name them.
    const photos = await listPhotosAtSite(site.id);
    const o = { siteCode: site.code, timeZone: site.timeZone, units: site.displayUnits, ...(photos.length > 0 ? { photos: photoFilesByOwner({ site, photos }) } : {}) };
    if (KINDS[kind].windowed) {
      if (!range) return 'The time window is still loading.';
      let from_ms: number, to_ms: number;
      try {
        from_ms = fromLocalInput(range.from, site.timeZone);
        to_ms = fromLocalInput(range.to, site.timeZone);
      } catch {
        return 'Type both ends of the window as a date and time.';
      }
      if (to_ms < from_ms) return 'The end of the window is before its start.';
      // The site's whole stage record of the window: spot readings and every logger value (core's join).
      const rows = stageExportRows(await stageRecordIn(site.id, from_ms, to_ms));
      if (rows.length === 0) return 'No readings in that window: nothing to export.';
      const loggerValues = rows.reduce((n, r) => n + (r.logger ? 1 : 0), 0);
      const counted = loggerValues > 0 ? `${rows.length - loggerValues} readings and ${loggerValues} logger values` : `${rows.length} readings`;
      const span = `${range.from.slice(0, 10)}_to_${range.to.slice(0, 10)}`;
      return kind === 'readings-csv'
        ? { text: readingsToCsv(rows, o), name: `${stem}_readings_${span}.csv`, type: 'text/csv;charset=utf-8', what: counted }
        : { text: watermlTimeseries({ site, readings: rows, generated_ms: Date.now() }), name: `${stem}_timeseries_${span}.xml`, type: 'application/xml', what: `${counted} as WaterML` };
    }
    const [gaugings, ratings] = await Promise.all([listGaugings(site.id), listRatings(site.id)]);
    switch (kind) {
      case 'ratings-waterml':
        if (ratings.length + gaugings.length === 0) return 'This site has no ratings or gaugings yet: nothing to export.';
        return { text: watermlRatings({ site, ratings, gaugings, generated_ms: Date.now() }), name: `${stem}_ratings.xml`, type: 'application/xml', what: `${ratings.length} ratings and ${gaugings.length} gaugings as WaterML` };
      case 'gaugings-csv':
        if (gaugings.length === 0) return 'This site has no gaugings yet: nothing to export.';
        return { text: gaugingsToCsv(gaugings, o), name: `${stem}_gaugings.csv`, type: 'text/csv;charset=utf-8', what: `${gaugings.length} gaugings` };
      case 'verticals-csv': {
        const measured = gaugings.filter((g) => g.verticals && g.verticals.length >= 2);
        if (measured.length === 0) return 'This site has no gaugings entered vertical by vertical: nothing to export.';
        const count = measured.reduce((n, g) => n + (g.verticals?.length ?? 0), 0);
        return { text: gaugingVerticalsToCsv(measured, o), name: `${stem}_gauging_verticals.csv`, type: 'text/csv;charset=utf-8', what: `${count} verticals of ${measured.length} gaugings` };
      }
      case 'rating-segments-csv':
      case 'rating-tables-csv':
        if (ratings.length === 0) return 'This site has no ratings yet: nothing to export.';
        return kind === 'rating-segments-csv'
          ? { text: ratingSegmentsToCsv(ratings, o), name: `${stem}_rating_equations.csv`, type: 'text/csv;charset=utf-8', what: `${ratings.length} ratings` }
          : { text: ratingTablesToCsv(ratings, o), name: `${stem}_rating_tables.csv`, type: 'text/csv;charset=utf-8', what: `${ratings.length} rating tables` };
      default:
        return 'Choose what to export.';
    }
  }

  async function run(share: boolean) {
    setStatus(undefined);
    setBusy(true);
    try {
      const made = await make();
      if (typeof made === 'string') {
        setStatus({ ok: false, text: made });
        return;
      }
      const r = await saveTextFile(made.text, made.name, made.type, share);
      setStatus(r.ok ? { ok: true, text: `${r.how === 'shared' ? 'Shared' : 'Downloaded'} ${made.what} as ${made.name}.` } : { ok: false, text: `Not shared: ${r.reason}.` });
    } catch {
      setStatus({ ok: false, text: 'The export could not be made from the records on this phone.' });
    } finally {
      setBusy(false);
    }
  }

  return (
    <section class="card" aria-labelledby="export-heading">
      <h3 id="export-heading">Export for the office</h3>
      <p class="hint">CSV opens in a spreadsheet (site units, times with the site’s UTC offset); WaterML 2.0 is the open standard hydrological databases import. Discharges are estimates from the rating in force.</p>
      <Field id="export-site" label="Site">
        <select id="export-site" value={site.id} onChange={(e) => setSiteId(e.currentTarget.value)}>
          {sites.map((s) => <option key={s.id} value={s.id}>{s.code} · {s.name}</option>)}
        </select>
      </Field>
      <Field id="export-kind" label="What">
        <select id="export-kind" value={kind} onChange={(e) => setKind(e.currentTarget.value as ExportKind)}>
          {(Object.keys(KINDS) as ExportKind[]).map((k) => <option key={k} value={k}>{KINDS[k].label}</option>)}
        </select>
      </Field>
      {range && KINDS[kind].windowed && (
        <>
          <Field id="export-from" label={`From (${site.timeZone})`}>
            <input id="export-from" type="datetime-local" value={range.from} aria-describedby={describedBy('export-from', false, false)} onInput={(e) => setRange({ ...range, from: e.currentTarget.value })} />
          </Field>
          <Field id="export-to" label={`To (${site.timeZone})`}>
            <input id="export-to" type="datetime-local" value={range.to} onInput={(e) => setRange({ ...range, to: e.currentTarget.value })} />
          </Field>
        </>
      )}
      <div class="row" style="margin-top:12px">
        <button type="button" class="primary" disabled={busy} onClick={() => void run(false)}>Download</button>
        {'share' in navigator && <button type="button" disabled={busy} onClick={() => void run(true)}>Share</button>}
      </div>
      {status && <p class={status.ok ? 'callout ok' : 'callout bad'} role="status">{status.text}</p>}
    </section>
  );
}
