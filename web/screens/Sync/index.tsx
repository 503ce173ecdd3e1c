// The Sync area: what waits for the office, the last exchange and the last problem in words, "send and
// receive now", the office endpoint settings, versions to review, and bundle files out and in.
import { useEffect, useState } from 'preact/hooks';
import type { Bundle, ConflictRecord, SiteRecord, SyncRecord } from '../../../core';
import {
  applyIncoming, exportBundle, getSyncValue, listConflicts, listSites, markExported, onSyncChanged, previewIncoming,
  settleConflict, syncedVersion, waitingCount, type IncomingResult, type SyncStatusRecord,
} from '../../db';
import type { ScreenProps } from '../../router';
import { useRecords } from '../../components/use-records';
import { describedBy, Field } from '../../components/Field';
import { formatAgo } from '../../format';
import { useStore } from '../../store';
import { syncNow, syncRunning } from '../../sync/engine';
import { PULL_EVERY_MS } from '../../sync/triggers';
import { readBundleFile, shareOrDownload } from '../../sync/files';
import { keepFilePhotos, withPhotoBytes } from '../../sync/photo-file';
import { loadSettings, saveSettings } from '../../sync/settings';
import { describeVersion, KIND_WORDS, reasonWords } from './describe';
import { SetAsideCard } from './SetAside';
import './style.css';
import { plainError } from '../../plain-words';

function useSyncState() {
  const [tick, setTick] = useState(0);
  useEffect(() => onSyncChanged(() => setTick((t) => t + 1)), []);
  return useRecords(
    async () => {
      const [waiting, status, settings] = await Promise.all([waitingCount(), getSyncValue('status'), loadSettings()]);
      return { waiting, status: status ?? ({} as SyncStatusRecord), settings };
    },
    ['site', 'reading', 'gauging', 'rating', 'analysis'],
    [tick],
  );
}

function StatusCard() {
  const state = useSyncState();
  const running = useStore(syncRunning);
  const now = Date.now();
  if (state.state !== 'ready') return <section class="card"><p aria-busy="true">Reading…</p></section>;
  const { waiting, status, settings } = state.value;
  const problem = status.lastProblem;
  return (
    <section class="card" aria-labelledby="sync-status-heading">
      <h3 id="sync-status-heading">Office exchange</h3>
      <dl class="facts">
        <dt>Waiting to go to the office</dt>
        <dd data-testid="waiting">{waiting === 0 ? 'nothing' : waiting === 1 ? '1 record' : `${waiting} records`}</dd>
        <dt>Last good exchange</dt>
        <dd data-testid="last-success">{status.lastSuccess_ms ? formatAgo(status.lastSuccess_ms, now) : 'not yet'}</dd>
      </dl>
      {problem && (
        <p class={problem.kind === 'fix' ? 'callout bad' : 'callout warn'} role="status" data-testid="problem">
          {problem.kind === 'fix' ? 'Needs your attention: ' : 'Will try again: '}
          {problem.message} ({formatAgo(problem.at_ms, now)})
        </p>
      )}
      <p class="hint" data-testid="pull-rule">
        This phone asks the office for new records when the app opens, when the network comes back, after it sends records and when you
        tap Send and receive now; otherwise at most every {PULL_EVERY_MS / 60_000} minutes while the app is on screen, never while it is in the background.
      </p>
      {!settings && <p class="hint">Enter the office address and token below to exchange records over the network. Bundle files work without them.</p>}
      <button type="button" class="primary wide" disabled={!settings || running} onClick={() => void syncNow()}>
        {running ? 'Exchanging…' : 'Send and receive now'}
      </button>
    </section>
  );
}

function SettingsCard() {
  const [base, setBase] = useState('');
  const [token, setToken] = useState('');
  const [hasToken, setHasToken] = useState(false);
  const [error, setError] = useState<string>();
  const [saved, setSaved] = useState(false);
  useEffect(() => {
    void loadSettings().then((s) => {
      if (!s) return;
      setBase(s.base);
      setHasToken(true);
    });
  }, []);
  async function save(e: Event) {
    e.preventDefault();
    setError(undefined);
    setSaved(false);
    try {
      const current = await loadSettings();
      // An empty token box keeps the stored token (it is never shown again).
      await saveSettings(base, token || (current?.token ?? ''));
      setToken('');
      setHasToken(true);
      setSaved(true);
      void syncNow();
    } catch (err) {
      setError(plainError(err, { doing: 'save' }));
    }
  }
  return (
    <section class="card" aria-labelledby="sync-settings-heading">
      <h3 id="sync-settings-heading">Office endpoint</h3>
      <form onSubmit={(e) => void save(e)}>
        <Field id="sync-base" label="Office address" hint="https://… as given by the office">
          <input id="sync-base" type="url" inputMode="url" autoComplete="off" spellcheck={false} value={base} aria-describedby={describedBy('sync-base', true, false)} onInput={(e) => setBase(e.currentTarget.value)} />
        </Field>
        <Field id="sync-token" label="Token for this phone" hint={hasToken ? 'A token is stored; type a new one to replace it.' : 'Kept on this phone only and sent in a header.'}>
          <input id="sync-token" type="password" autoComplete="off" value={token} aria-describedby={describedBy('sync-token', true, false)} onInput={(e) => setToken(e.currentTarget.value)} />
        </Field>
        {error && <p class="callout bad" role="alert">{error}</p>}
        {saved && <p class="callout ok" role="status">Saved.</p>}
        <button type="submit" class="wide">Save endpoint</button>
      </form>
    </section>
  );
}

function ReviewCard({ sites }: { sites: Map<string, SiteRecord> }) {
  const conflicts = useRecords(async () => {
    const list = await listConflicts();
    const current = await Promise.all(list.map((c) => currentOf(c)));
    return list.map((c, i) => ({ conflict: c, current: current[i] }));
  }, ['conflict', 'site', 'reading', 'gauging', 'rating', 'analysis'], []);
  const [error, setError] = useState<string>();
  if (conflicts.state !== 'ready' || conflicts.value.length === 0) return null;
  const settle = (id: string, useKept: boolean) => {
    setError(undefined);
    settleConflict(id, useKept).catch((e: unknown) => setError(plainError(e, { doing: 'save' })));
  };
  return (
    <section class="card" aria-labelledby="review-heading">
      <h3 id="review-heading">Versions to review ({conflicts.value.length})</h3>
      {error && <p class="callout bad" role="alert">{error}</p>}
      <ul class="review-list">
        {conflicts.value.map(({ conflict: c, current }) => (
          <li key={c.id} class="review-item">
            <p><strong>{KIND_WORDS[c.kind]}</strong> · {reasonWords(c)}</p>
            <div class="versions">
              <div>
                <h4>In use</h4>
                <ul>{current ? describeVersion(current, sites).map((l) => <li key={l}>{l}</li>) : <li>Not on this device</li>}</ul>
              </div>
              <div>
                <h4>{c.reason === 'ahead' ? 'Replaced' : 'Kept aside'}</h4>
                <ul>{describeVersion(c.losing, sites).map((l) => <li key={l}>{l}</li>)}</ul>
              </div>
            </div>
            <div class="row">
              <button type="button" onClick={() => settle(c.id, false)}>Keep the one in use</button>
              <button type="button" onClick={() => settle(c.id, true)}>{c.reason === 'ahead' ? 'Put the replaced one back' : 'Use the kept-aside one'}</button>
            </div>
          </li>
        ))}
      </ul>
    </section>
  );
}

const currentOf = (c: ConflictRecord): Promise<SyncRecord | undefined> => syncedVersion(c.kind, c.recordId);

function summaryWords(r: IncomingResult['summary']): string {
  const parts = [
    `${r.new} new`, `${r.updated} updated`, `${r.conflicts} to review`, `${r.unchanged} already here or older`,
  ];
  if (r.ahead > 0) parts.push(`${r.ahead} dated ahead of this device’s clock`);
  return parts.join(', ');
}

function FilesCard() {
  const canShare = typeof navigator !== 'undefined' && typeof navigator.canShare === 'function';
  const [useShare, setUseShare] = useState(canShare);
  const [status, setStatus] = useState<{ ok: boolean; text: string }>();
  const [pending, setPending] = useState<{ bundle: Bundle; blobs: Awaited<ReturnType<typeof readBundleFile>>['blobs']; name: string; summary: IncomingResult['summary'] }>();
  const [busy, setBusy] = useState(false);

  async function save(changesOnly: boolean) {
    setStatus(undefined);
    try {
      const file = await exportBundle(changesOnly);
      if (file.bundle.records.length === 0) {
        setStatus({ ok: false, text: changesOnly ? 'Nothing changed since the last delivery or file of changes: no file made.' : 'No records on this device to save.' });
        return;
      }
      const out = await shareOrDownload(await withPhotoBytes(file.bundle), changesOnly, useShare);
      if (out.kind === 'cancelled') {
        setStatus({ ok: false, text: 'Not shared: the share sheet was closed.' });
        return;
      }
      if (changesOnly) await markExported(file.through);
      const n = file.bundle.records.length;
      const left = file.leftOut === 0 ? '' : ` ${file.leftOut} record${file.leftOut === 1 ? ' was' : 's were'} left out: ${file.leftOut === 1 ? 'it holds' : 'they hold'} text or values a bundle cannot carry (fix them in their forms).`;
      setStatus({ ok: true, text: `${n} record${n === 1 ? '' : 's'} ${out.kind === 'shared' ? 'shared as' : 'saved to'} ${out.name}.${left}` });
    } catch (e) {
      setStatus({ ok: false, text: plainError(e, { doing: 'save' }) });
    }
  }

  async function open(input: HTMLInputElement) {
    const file = input.files?.[0];
    input.value = '';
    setStatus(undefined);
    setPending(undefined);
    if (!file) return;
    try {
      const { bundle, blobs } = await readBundleFile(file);
      const { summary } = await previewIncoming(bundle.records);
      setPending({ bundle, blobs, name: file.name, summary });
    } catch (e) {
      setStatus({ ok: false, text: `${plainError(e, { fallback: 'This file is not a bundle this phone can take.' })} Nothing was changed.` });
    }
  }

  async function apply() {
    if (!pending) return;
    setBusy(true);
    try {
      const { summary } = await applyIncoming(pending.bundle.records);
      const photos = await keepFilePhotos(pending.blobs);
      setStatus({ ok: true, text: `Added from ${pending.name}: ${summaryWords(summary)}${photos > 0 ? `; ${photos} photo${photos === 1 ? '' : 's'} kept` : ''}.` });
      setPending(undefined);
    } catch (e) {
      setStatus({ ok: false, text: `${plainError(e, { fallback: 'This file is not a bundle this phone can take.' })} Nothing was changed.` });
    } finally {
      setBusy(false);
    }
  }

  return (
    <section class="card" aria-labelledby="files-heading">
      <h3 id="files-heading">Bundle files (no network needed)</h3>
      <p class="hint">A bundle file carries records between this device and the office, or another phone, by any means: share sheet, cable, memory card.</p>
      {canShare && (
        <label class="check">
          <input type="checkbox" checked={useShare} onChange={(e) => setUseShare(e.currentTarget.checked)} /> Offer the file to the share sheet
        </label>
      )}
      <div class="row">
        <button type="button" onClick={() => void save(true)}>File of changes since last delivery</button>
        <button type="button" onClick={() => void save(false)}>File of every record</button>
      </div>
      <Field id="bundle-open" label="Open a bundle file" hint="Shows what would change before anything is added.">
        <input id="bundle-open" type="file" accept=".json,.txt,application/json,text/plain" aria-describedby={describedBy('bundle-open', true, false)} onChange={(e) => void open(e.currentTarget)} />
      </Field>
      {pending && (
        <div class="callout" role="status" data-testid="import-summary">
          <p>
            {pending.name}: {pending.bundle.records.length} record{pending.bundle.records.length === 1 ? '' : 's'} from device {pending.bundle.device.slice(0, 8)}, made {pending.bundle.created.slice(0, 16).replace('T', ' ')} UTC.
          </p>
          <p>If added: {summaryWords(pending.summary)}.</p>
          <div class="row">
            <button type="button" class="primary" disabled={busy} onClick={() => void apply()}>Add these records</button>
            <button type="button" disabled={busy} onClick={() => setPending(undefined)}>Cancel</button>
          </div>
        </div>
      )}
      {status && <p class={status.ok ? 'callout ok' : 'callout bad'} role="status" data-testid="files-status">{status.text}</p>}
    </section>
  );
}

/** The Sync area. */
export default function Sync(_props: ScreenProps) {
  const sites = useRecords(async () => new Map((await listSites()).map((s) => [s.id, s])), ['site'], []);
  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>Sync with the office</h2>
      <div class="sync-grid">
        <div>
          <StatusCard />
          {sites.state === 'ready' && <SetAsideCard sites={sites.value} />}
          {sites.state === 'ready' && <ReviewCard sites={sites.value} />}
        </div>
        <div>
          <FilesCard />
          <SettingsCard />
        </div>
      </div>
    </>
  );
}
