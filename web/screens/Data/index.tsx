// Data: what is stored on this phone, whether the browser will keep it, exports for the office (CSV and
// WaterML 2.0, by download or the phone's share sheet) and readings imported from CSV.
import { useEffect, useState } from 'preact/hooks';
import { listConflicts, listDrafts, listSites, photoBytesSummary, storageState, type StorageState } from '../../db';
import { useRecords } from '../../components/use-records';
import { formatTime } from '../../format';
import { href, type ScreenProps } from '../../router';
import { CsvImportSection } from './csv-import-section';
import { ExportSection } from './export-section';

function bytes(n: number): string {
  return n < 1024 ** 2 ? `${(n / 1024).toFixed(1)} KiB` : n < 1024 ** 3 ? `${(n / 1024 ** 2).toFixed(1)} MiB` : `${(n / 1024 ** 3).toFixed(2)} GiB`;
}

function StorageSection() {
  const [state, setState] = useState<StorageState & { photos?: { count: number; bytes: number } }>();
  const [asked, setAsked] = useState<string>();
  const refresh = () => void Promise.all([storageState(), photoBytesSummary().catch(() => undefined)]).then(([s, photos]) => setState({ ...s, photos }));
  useEffect(refresh, []);
  return (
    <section class="card" aria-labelledby="storage-heading">
      <h3 id="storage-heading">Storage on this phone</h3>
      {!state && <p aria-busy="true">Checking…</p>}
      {state && (
        <dl class="facts">
          <dt>Kept by the browser</dt>
          <dd>{state.persisted === 'unsupported' ? 'not offered by this browser' : state.persisted ? 'yes, persistent' : 'not yet'}</dd>
          <dt>Space used</dt>
          <dd>{state.usage_bytes !== undefined && state.quota_bytes ? `${bytes(state.usage_bytes)} of ${bytes(state.quota_bytes)}` : 'not reported'}</dd>
          <dt>Photos</dt>
          <dd>{!state.photos ? 'not reported' : state.photos.count === 0 ? 'none' : `${state.photos.count} picture${state.photos.count === 1 ? '' : 's'}, ${bytes(state.photos.bytes)}`}</dd>
        </dl>
      )}
      {state && state.persisted === false && (
        <button
          type="button"
          class="wide"
          onClick={async () => {
            const granted = await navigator.storage.persist();
            setAsked(granted ? 'The browser will keep Freshet’s records.' : 'The browser did not agree yet; it often does once the app is installed or used more.');
            refresh();
          }}
        >
          Ask the browser to keep my records
        </button>
      )}
      {asked && <p role="status">{asked}</p>}
    </section>
  );
}

/** The Data area. */
export default function Data(_props: ScreenProps) {
  const info = useRecords(
    async () => {
      const [sites, drafts, conflicts] = await Promise.all([listSites(), listDrafts('reading'), listConflicts()]);
      return { sites, drafts, conflicts };
    },
    ['site', 'draft', 'conflict'],
    [],
  );
  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>Data on this phone</h2>
      {info.state === 'loading' && <p aria-busy="true">Reading…</p>}
      {info.state === 'failed' && <p class="callout bad" role="alert">{info.message}</p>}
      {info.state === 'ready' && (
        <>
          <section class="card" aria-labelledby="held-heading">
            <h3 id="held-heading">Held here</h3>
            <dl class="facts">
              <dt>Sites</dt>
              <dd>{info.value.sites.length}</dd>
              <dt>Unsaved reading forms</dt>
              <dd>
                {info.value.drafts.length === 0
                  ? 'none'
                  : info.value.drafts.map((d) => {
                      const s = info.value.sites.find((x) => x.id === d.siteId);
                      return s ? (
                        <a key={d.id} href={href('record', s.id)} style="display:block">
                          {s.code}, last changed {formatTime(d.updated_ms, s.timeZone)}
                        </a>
                      ) : null;
                    })}
              </dd>
              <dt>Versions to review</dt>
              <dd>{info.value.conflicts.length === 0 ? 'none' : info.value.conflicts.length}</dd>
            </dl>
            <p class="hint">Every reading stays on this phone until it has reached the office; deleted records are kept as markers so the deletion reaches the office too.</p>
          </section>
          {info.value.sites.length > 0 && (
            <section class="card" aria-labelledby="logger-heading">
              <h3 id="logger-heading">Logger files</h3>
              <p class="hint">Read a water-level logger’s file, correct its drift from your check readings, and keep it with the site’s readings.</p>
              <a class="button wide" href={href('data', 'logger')}>Import a logger file</a>
            </section>
          )}
          {info.value.sites.length > 0 && <ExportSection sites={info.value.sites} />}
          {info.value.sites.length > 0 && <CsvImportSection sites={info.value.sites} />}
        </>
      )}
      <StorageSection />
    </>
  );
}
