// Versions kept out of the office exchange (web/db/outbox-state.ts): each with its reason in plain words,
// a link to the form that fixes it, and a recorded choice not to send it. Everything else keeps going.
import { useEffect, useState } from 'preact/hooks';
import type { SiteRecord, SyncRecord } from '../../../core';
import { dropSetAside, listSetAside, onSyncChanged, syncedVersion, type SetAsideView } from '../../db';
import { useRecords } from '../../components/use-records';
import { formatAgo } from '../../format';
import { INTERNAL_WORDS, plainError } from '../../plain-words';
import { href } from '../../router';
import { describeVersion, KIND_WORDS } from './describe';

/** The reason as the user reads it: the office's or the phone's sentence, or a general one when it holds internal names. */
export function reasonText(v: Pick<SetAsideView, 'reason' | 'by'>): string {
  const said = v.reason.replace(/^Record \d+ of the bundle /, 'This version ');
  if (!INTERNAL_WORDS.test(said)) return said;
  return v.by === 'office'
    ? 'The office could not store this version of the record (it refused it as not valid).'
    : 'This version does not pass this phone’s checks for sending.';
}

/** Where the record is fixed: its edit form, or the list it is edited from. */
export function fixLink(v: Pick<SetAsideView, 'kind' | 'id' | 'siteId'>): string | undefined {
  const site = v.siteId;
  switch (v.kind) {
    case 'site': return href('sites', v.id, 'edit');
    case 'reading': return site ? href('record', site, v.id) : undefined;
    case 'rating': return site ? href('sites', site, 'ratings', v.id) : undefined;
    case 'gauging': return site ? href('sites', site, 'gaugings') : undefined;
    case 'analysis': return site ? href('storm', site) : undefined;
    case 'logger-day': return site ? href('sites', site) : undefined;
  }
}

function Item({ v, version, sites }: { v: SetAsideView; version: SyncRecord | undefined; sites: ReadonlyMap<string, SiteRecord> }) {
  const [asking, setAsking] = useState(false);
  const [error, setError] = useState<string>();
  const link = v.deleted ? undefined : fixLink(v);
  const site = v.siteId ? sites.get(v.siteId) : undefined;
  return (
    <li class="review-item" data-testid="set-aside-item">
      <p><strong>{KIND_WORDS[v.kind]}</strong>{site ? ` · ${site.code} ${site.name}` : ''} · held back {formatAgo(v.at_ms, Date.now())}</p>
      <p class="callout warn">{reasonText(v)}</p>
      {version && <ul>{describeVersion(version, sites).map((l) => <li key={l}>{l}</li>)}</ul>}
      {error && <p class="callout bad" role="alert">{error}</p>}
      {asking ? (
        <div class="callout" role="group" aria-label="Not sending this version">
          <p>Not send this version? It stays on this phone and in its exports; only the office will not get it. A later edit is sent as usual.</p>
          <div class="row">
            <button type="button" onClick={() => dropSetAside(v.mark).catch((e: unknown) => setError(plainError(e, { doing: 'save', fallback: 'the choice could not be stored on this phone.' })))}>Yes, do not send it</button>
            <button type="button" onClick={() => setAsking(false)}>Keep it here for now</button>
          </div>
        </div>
      ) : (
        <div class="row">
          {link && <a class="button primary" href={link}>Open to fix</a>}
          <button type="button" onClick={() => setAsking(true)}>Do not send…</button>
        </div>
      )}
    </li>
  );
}

/** The card: versions held back, and those the user chose not to send. Nothing when there are none. */
export function SetAsideCard({ sites }: { sites: ReadonlyMap<string, SiteRecord> }) {
  const [tick, setTick] = useState(0);
  useEffect(() => onSyncChanged(() => setTick((t) => t + 1)), []);
  const list = useRecords(
    async () => {
      const views = await listSetAside();
      const open = views.filter((v) => v.state === 'open');
      const versions = await Promise.all(open.map((v) => syncedVersion(v.kind, v.id)));
      return { open: open.map((v, i) => ({ v, version: versions[i] })), dropped: views.filter((v) => v.state === 'dropped') };
    },
    ['site', 'reading', 'gauging', 'rating', 'analysis', 'logger-day'],
    [tick],
  );
  if (list.state !== 'ready' || (list.value.open.length === 0 && list.value.dropped.length === 0)) return null;
  const { open, dropped } = list.value;
  return (
    <section class="card" aria-labelledby="set-aside-heading">
      <h3 id="set-aside-heading">Held back from the office ({open.length})</h3>
      <p class="hint">These versions could not be sent. Everything else keeps going. Fix each one (its form opens) or choose not to send it.</p>
      <ul class="review-list">
        {open.map(({ v, version }) => <Item key={v.mark} v={v} version={version} sites={sites} />)}
      </ul>
      {dropped.length > 0 && (
        <details>
          <summary>Not sent by your choice ({dropped.length})</summary>
          <ul class="review-list">
            {dropped.map((v) => (
              <li key={v.mark} class="review-item">
                <strong>{KIND_WORDS[v.kind]}</strong> · {v.dropped?.because === 'deleted' ? 'deleted on this phone' : 'not sent'} {v.dropped ? formatAgo(v.dropped.at_ms, Date.now()) : ''} · {reasonText(v)}
              </li>
            ))}
          </ul>
        </details>
      )}
    </section>
  );
}
