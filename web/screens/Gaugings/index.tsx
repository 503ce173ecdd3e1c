// A site's gaugings: the list, newest first (time, mean stage, measured discharge, grade, deviation from
// the rating in force at its time and whether it checks within its grade), one gauging read back, a new
// gauging, or the correction of a saved one, by the path after "gaugings".
import type { SiteRecord } from '../../../core';
import { deleteGauging, getGauging, getSite, ratingsAndGaugings } from '../../db';
import { useRecords } from '../../components/use-records';
import { formatQuantity, formatTime } from '../../format';
import { href, type ScreenProps } from '../../router';
import { gaugingCheck } from './check';
import { GaugingEntry } from './entry';
import { GaugingView } from './view';
import './style.css';

function GaugingsList({ site }: { site: SiteRecord }) {
  const data = useRecords(() => ratingsAndGaugings(site.id), ['rating', 'gauging'], [site.id]);
  const u = site.displayUnits;
  if (data.state === 'loading') return <p aria-busy="true">Reading the gaugings…</p>;
  if (data.state === 'failed') return <p class="callout bad" role="alert">{data.message}</p>;
  const { ratings, gaugings } = data.value;
  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>Gaugings of {site.name}</h2>
      <div class="row">
        <a class="button primary" href={href('sites', site.id, 'gaugings', 'new')}>New gauging</a>
        <a class="button" href={href('sites', site.id, 'ratings')}>Ratings</a>
      </div>
      <p class="hint">Checks: the deviation from the rating in force at the gauging’s time is within its grade (common practice: excellent 2 %, good 5 %, fair 8 %). Tap a gauging to see its verticals or correct it.</p>
      {gaugings.length === 0 ? <p>No gaugings of this site yet.</p> : (
        <ul class="list card" aria-label="Gaugings, newest first">
          {[...gaugings].reverse().map((g) => {
            const c = gaugingCheck(g, ratings);
            return (
              <li key={g.id}>
                <a class="item" href={href('sites', site.id, 'gaugings', g.id)}>
                  <span>
                    <strong>{formatQuantity('discharge', g.discharge_m3s, u)}</strong>
                    <span class="hint">at {formatQuantity('stage', g.meanStage_m, u)} · {g.grade}{g.verticals ? ` · ${g.verticals.length} verticals` : ''}</span>
                  </span>
                  <span>
                    <span>{formatTime(g.time_ms, site.timeZone)}</span>
                    <span class="hint" data-testid="gauging-deviation">
                      {c ? `${c.deviation_pct > 0 ? '+' : ''}${c.deviation_pct.toFixed(1)} % · ${c.checks ? 'checks' : 'does not check'}` : 'no rating to check'}
                    </span>
                  </span>
                </a>
              </li>
            );
          })}
        </ul>
      )}
    </>
  );
}

/** One saved gauging, read back or being corrected. */
function SavedGauging({ site, gaugingId, edit }: { site: SiteRecord; gaugingId: string; edit: boolean }) {
  const data = useRecords(async () => ({ gauging: await getGauging(gaugingId), ratings: (await ratingsAndGaugings(site.id)).ratings }), ['rating', 'gauging'], [site.id, gaugingId]);
  if (data.state === 'loading') return <p aria-busy="true">Reading the gauging…</p>;
  if (data.state === 'failed') return <p class="callout bad" role="alert">{data.message}</p>;
  const g = data.value.gauging;
  if (!g || g.siteId !== site.id) return <p id="screen-title" tabIndex={-1}>This gauging is not on this phone (it may have been deleted). <a href={href('sites', site.id, 'gaugings')}>All gaugings</a></p>;
  // The form keeps the revision it opened; a later change elsewhere does not reset what is being typed.
  return edit ? <GaugingEntry key={g.id} site={site} saved={g} /> : <GaugingView site={site} gauging={g} ratings={data.value.ratings} />;
}

/** The gaugings area of a site, by the path after "gaugings": the list, 'new', ':gaugingId' or ':gaugingId/edit'. */
export default function Gaugings({ route, params }: ScreenProps) {
  const siteId = params.siteId;
  const path = route.segments.slice(3);
  const site = useRecords(() => getSite(siteId), ['site'], [siteId]);
  if (site.state === 'loading') return <p aria-busy="true">Opening the site…</p>;
  if (site.state === 'failed') return <p class="callout bad" role="alert">{site.message}</p>;
  if (!site.value) return <p>This site is not on this phone. <a href={href('sites')}>Back to the sites</a></p>;
  const s = site.value;
  const back = path.length === 2 ? href('sites', s.id, 'gaugings', path[0]) : path.length ? href('sites', s.id, 'gaugings') : href('sites', s.id);
  return (
    <>
      <p><a href={back}>‹ {path.length === 2 ? 'This gauging' : path.length ? 'Gaugings of this site' : s.name}</a></p>
      {path[0] === 'new' ? <GaugingEntry site={s} /> : path[0] ? <SavedGauging site={s} gaugingId={path[0]} edit={path[1] === 'edit'} /> : <GaugingsList site={s} />}
    </>
  );
}
