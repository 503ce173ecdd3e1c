// Data: what is stored on this phone, whether the browser will keep it, and readings exported as CSV
// for the office (by download or the phone's share sheet).
import { useEffect, useState } from 'preact/hooks';
import { fromLocalInput, MS_PER_DAY, readingsToCsv, toLocalInput, type SiteRecord } from '../../../core';
import { latestReadings, listConflicts, listDrafts, listSites, readingsWithDischarge, storageState, type StorageState } from '../../db';
import type { ScreenProps } from '../../router';
import { useRecords } from '../../db/use-records';
import { describedBy, Field } from '../../components/Field';
import { formatTime } from '../../format';
import { href } from '../../router';

function bytes(n: number): string {
  return n < 1024 ** 2 ? `${(n / 1024).toFixed(1)} KiB` : n < 1024 ** 3 ? `${(n / 1024 ** 2).toFixed(1)} MiB` : `${(n / 1024 ** 3).toFixed(2)} GiB`;
}

function StorageSection() {
  const [state, setState] = useState<StorageState>();
  const [asked, setAsked] = useState<string>();
  const refresh = () => void storageState().then(setState);
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

function ExportSection({ sites }: { sites: SiteRecord[] }) {
  const [siteId, setSiteId] = useState(sites[0]?.id ?? '');
  const site = sites.find((s) => s.id === siteId) ?? sites[0];
  const [range, setRange] = useState<{ from: string; to: string }>();
  const [status, setStatus] = useState<{ ok: boolean; text: string }>();
  // Default window: the 30 days up to the site's latest reading.
  useEffect(() => {
    if (!site) return;
    void latestReadings([site.id]).then((m) => {
      const end = m.get(site.id)?.time_ms ?? Date.now();
      setRange({ from: toLocalInput(end - 30 * MS_PER_DAY, site.timeZone), to: toLocalInput(end + 60_000, site.timeZone) });
    });
  }, [site?.id]);
  if (!site) return null;

  async function exportCsv(share: boolean) {
    if (!range) return;
    setStatus(undefined);
    let from_ms: number, to_ms: number;
    try {
      from_ms = fromLocalInput(range.from, site.timeZone);
      to_ms = fromLocalInput(range.to, site.timeZone);
    } catch (err) {
      setStatus({ ok: false, text: (err as Error).message });
      return;
    }
    if (to_ms < from_ms) {
      setStatus({ ok: false, text: 'The end of the window is before its start.' });
      return;
    }
    const rows = await readingsWithDischarge(site.id, from_ms, to_ms);
    if (rows.length === 0) {
      setStatus({ ok: false, text: 'No readings in that window: nothing to export.' });
      return;
    }
    const csv = readingsToCsv(rows, { siteCode: site.code, timeZone: site.timeZone, units: site.displayUnits });
    const name = `${site.code.replace(/[^\w.-]+/g, '_')}_readings_${range.from.slice(0, 10)}_to_${range.to.slice(0, 10)}.csv`;
    const file = new File([csv], name, { type: 'text/csv;charset=utf-8' });
    if (share && navigator.canShare?.({ files: [file] })) {
      try {
        await navigator.share({ files: [file], title: name });
        setStatus({ ok: true, text: `Shared ${rows.length} readings.` });
      } catch (err) {
        setStatus({ ok: false, text: `Not shared: ${(err as Error).message}` });
      }
      return;
    }
    const url = URL.createObjectURL(file);
    const a = document.createElement('a');
    a.href = url;
    a.download = name;
    a.click();
    setTimeout(() => URL.revokeObjectURL(url), 10_000);
    setStatus({ ok: true, text: `${rows.length} readings written to ${name}.` });
  }

  return (
    <section class="card" aria-labelledby="export-heading">
      <h3 id="export-heading">Export readings as CSV</h3>
      <p class="hint">One row per reading with its discharge, in the site’s units, times with the site’s UTC offset.</p>
      <Field id="export-site" label="Site">
        <select id="export-site" value={site.id} onChange={(e) => setSiteId(e.currentTarget.value)}>
          {sites.map((s) => <option key={s.id} value={s.id}>{s.code} · {s.name}</option>)}
        </select>
      </Field>
      {range && (
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
        <button type="button" class="primary" onClick={() => void exportCsv(false)}>Download CSV</button>
        {'share' in navigator && <button type="button" onClick={() => void exportCsv(true)}>Share CSV</button>}
      </div>
      {status && <p class={status.ok ? 'callout ok' : 'callout bad'} role="status">{status.text}</p>}
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
          {info.value.sites.length > 0 && <ExportSection sites={info.value.sites} />}
        </>
      )}
      <StorageSection />
    </>
  );
}
