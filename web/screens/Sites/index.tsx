// Sites: every site with its latest reading, that reading's discharge and how long ago; the way in to
// a site's readings, to a new site, and (from the empty state) to the demo site.
import { useState } from 'preact/hooks';
import type { ScreenProps } from '../../router';
import { useRecords } from '../../components/use-records';
import { listSites, readingsWithDischarge, latestReadings, type ReadingWithDischarge } from '../../db';
import { formatAgo, formatQuantity } from '../../format';
import { href, navigate } from '../../router';
import { hasDischarge, type SiteRecord } from '../../../core';
import { plainError } from '../../plain-words';

interface SiteRow {
  site: SiteRecord;
  latest?: ReadingWithDischarge;
}

async function readSites(): Promise<SiteRow[]> {
  const sites = await listSites();
  const latest = await latestReadings(sites.map((s) => s.id));
  return Promise.all(
    sites.map(async (site) => {
      const r = latest.get(site.id);
      // The discharge of the latest reading through the rating in force at its time.
      const withQ = r ? (await readingsWithDischarge(site.id, r.time_ms, r.time_ms)).find((x) => x.reading.id === r.id) : undefined;
      return { site, latest: withQ };
    }),
  );
}

function DemoButton({ label }: { label: string }) {
  const [progress, setProgress] = useState<string>();
  const [error, setError] = useState<string>();
  return (
    <>
      <button
        type="button"
        class="wide primary"
        disabled={progress !== undefined}
        onClick={async () => {
          setError(undefined);
          setProgress('Preparing…');
          try {
            // The demo's scenario and the bulk writer load on this tap, not with the first screen.
            const { loadDemoSite } = await import('../../app/demo');
            const id = await loadDemoSite((p) => setProgress(`Writing readings: ${p.written.toLocaleString('en')} of ${p.total.toLocaleString('en')}`));
            navigate(href('sites', id));
          } catch (err) {
            setError(plainError(err, { doing: 'save' }));
          } finally {
            setProgress(undefined);
          }
        }}
      >
        {progress ?? label}
      </button>
      {progress && <progress class="wide" aria-label="Loading the demo site" />}
      {error && <p class="callout bad" role="alert">The demo site could not be loaded: {error}</p>}
    </>
  );
}

function SitesList() {
  const rows = useRecords(readSites, ['site', 'reading', 'rating'], []);
  const now = Date.now();
  return (
    <>
      <div class="row">
        <h2 id="screen-title" tabIndex={-1}>Sites</h2>
        <a class="button" href={href('sites', 'new')} style="flex:0 0 auto">Add a site</a>
      </div>
      {rows.state === 'loading' && <p aria-busy="true">Reading the sites on this phone…</p>}
      {rows.state === 'failed' && <p class="callout bad" role="alert">The sites could not be read: {rows.message}</p>}
      {rows.state === 'ready' && rows.value.length === 0 && (
        <div class="card">
          <p><strong>No sites on this phone yet.</strong></p>
          <p>Add your first gauging station, or try Freshet with an invented demo site: three weeks of
            15-minute logger readings with one storm, a dozen gaugings and a two-segment rating.</p>
          <DemoButton label="Load the demo site" />
          <p><a class="button wide" href={href('sites', 'new')}>Add a site</a></p>
        </div>
      )}
      {rows.state === 'ready' && rows.value.length > 0 && (
        <ul class="list card" aria-label="Sites">
          {rows.value.map(({ site, latest }) => (
            <li key={site.id}>
              <a class="item" href={href('sites', site.id)}>
                <span>
                  <strong>{site.name}</strong>
                  <span class="hint">{site.code}</span>
                </span>
                <span style="text-align:right">
                  {latest ? (
                    <>
                      <span>{formatQuantity('stage', latest.reading.stage_m, site.displayUnits)}</span>
                      <span class="hint">
                        {!hasDischarge(latest.discharge_m3s) ? 'no rating' : formatQuantity('discharge', latest.discharge_m3s, site.displayUnits)}
                        {latest.extrapolated && ' (extrapolated)'}
                      </span>
                      <span class="hint">{formatAgo(latest.reading.time_ms, now)}</span>
                    </>
                  ) : (
                    <span class="hint">no readings yet</span>
                  )}
                </span>
              </a>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}

/** The Sites area's home: every site with its latest reading. */
export default function Sites(_props: ScreenProps) {
  return <SitesList />;
}
