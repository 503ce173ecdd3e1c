// Storm runoff: pick a site, let the core find last storm's key points, separate baseflow and read the
// direct runoff volume and depth; save the analysis on the phone.
import { useEffect } from 'preact/hooks';
import type { ScreenProps } from '../../router';
import { Cautions } from '../../components/Cautions';
import { listSites } from '../../db';
import { href, navigate } from '../../router';
import { SiteStorm } from './site-storm';
import { useRecords } from '../../components/use-records';
import './style.css';

/** The Storm runoff screen; '#/storm/<siteId>' opens it on that site. */
export default function Storm({ params }: ScreenProps) {
  const siteId = params.siteId;
  const sites = useRecords(() => listSites(), ['site'], []);
  const list = sites.state === 'ready' ? sites.value : [];
  const site = siteId === undefined ? undefined : list.find((s) => s.id === siteId);
  useEffect(() => {
    // With a single site there is nothing to choose: open it.
    if (siteId === undefined && list.length === 1) navigate(href('storm', list[0].id), true);
  }, [siteId, list.length]);
  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>Storm runoff</h2>
      {sites.state === 'loading' && <p class="muted">Reading the sites…</p>}
      {sites.state === 'failed' && <p class="callout bad" role="alert">{sites.message}</p>}
      {sites.state === 'ready' && list.length === 0 && (
        <p class="callout" data-testid="storm-no-sites">
          There are no sites on this phone yet. <a href="#/sites">Add a site</a> first, then come back for the storm.
        </p>
      )}
      {list.length > 0 && (
        <>
          <label for="storm-site">Site</label>
          <select
            id="storm-site"
            value={site ? site.id : ''}
            onChange={(e) => {
              const id = e.currentTarget.value;
              if (id) navigate(href('storm', id), true);
            }}
          >
            {!site && <option value="">Choose a site</option>}
            {list.map((s) => (
              <option key={s.id} value={s.id}>{`${s.code} · ${s.name}`}</option>
            ))}
          </select>
        </>
      )}
      {sites.state === 'ready' && siteId !== undefined && !site && (
        <p class="callout warn">That site is not on this phone (it may have been deleted). Choose another.</p>
      )}
      {site && <SiteStorm key={site.id} site={site} />}
      <Cautions />
    </>
  );
}
