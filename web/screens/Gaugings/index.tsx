// A site's gaugings, newest first: time, mean stage, measured discharge, grade, deviation from the rating
// in force at its time, whether it checks the rating within its grade, and the shift it implies.
import type { SiteRecord } from '../../../core';
import { deleteGauging, getSite, ratingsAndGaugings } from '../../db';
import { useRecords } from '../../components/use-records';
import { formatQuantity, formatTime } from '../../format';
import { href, type ScreenProps } from '../../router';
import { gaugingCheck } from './check';
import { GaugingEntry } from './entry';
import '../Ratings/style.css';

const GRADE_WORDS = { excellent: 'excellent (2 %)', good: 'good (5 %)', fair: 'fair (8 %)', poor: 'poor (over 8 %)' } as const;

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
      <p class="hint">Checks: the deviation from the rating in force at the gauging’s time is within its grade (common practice: excellent 2 %, good 5 %, fair 8 %).</p>
      {gaugings.length === 0 ? <p>No gaugings of this site yet.</p> : (
        <ul class="list card" aria-label="Gaugings, newest first">
          {[...gaugings].reverse().map((g) => {
            const c = gaugingCheck(g, ratings);
            return (
              <li key={g.id}>
                <details>
                  <summary class="item">
                    <span>
                      <strong>{formatQuantity('discharge', g.discharge_m3s, u)}</strong>
                      <span class="hint">at {formatQuantity('stage', g.meanStage_m, u)} · {g.grade}</span>
                    </span>
                    <span>
                      <span>{formatTime(g.time_ms, site.timeZone)}</span>
                      <span class="hint" data-testid="gauging-deviation">
                        {c ? `${c.deviation_pct > 0 ? '+' : ''}${c.deviation_pct.toFixed(1)} % · ${c.checks ? 'checks' : 'does not check'}` : 'no rating to check'}
                      </span>
                    </span>
                  </summary>
                  <div class="more">
                    <p class="hint">
                      {g.method}{g.verticals ? `, ${g.verticals.length} verticals` : ''} · grade {GRADE_WORDS[g.grade]}{g.observer && ` · by ${g.observer}`}
                    </p>
                    {c && <p>Rated {formatQuantity('discharge', c.rated_m3s, u)}{c.appliedShift_m !== 0 && ` with a shift of ${formatQuantity('stage', c.appliedShift_m, u)}`}; the gauging implies a shift of {formatQuantity('stage', c.impliedShift_m, u)}.</p>}
                    {g.note && <p>Note: {g.note}</p>}
                    <button type="button" class="danger" onClick={() => void deleteGauging(g.id)} aria-label={`Delete the gauging of ${formatTime(g.time_ms, site.timeZone)}`}>Delete</button>
                  </div>
                </details>
              </li>
            );
          })}
        </ul>
      )}
    </>
  );
}

/** The gaugings area of a site: the list or a new gauging, by the path after "gaugings". */
export default function Gaugings({ route, params }: ScreenProps) {
  const siteId = params.siteId;
  // The part of the path after "gaugings": [] for the list, ['new'], ['fit'], ['import'] or [ratingId].
  const path = route.segments.slice(3);
  const site = useRecords(() => getSite(siteId), ['site'], [siteId]);
  if (site.state === 'loading') return <p aria-busy="true">Opening the site…</p>;
  if (site.state === 'failed') return <p class="callout bad" role="alert">{site.message}</p>;
  if (!site.value) return <p>This site is not on this phone. <a href={href('sites')}>Back to the sites</a></p>;
  const s = site.value;
  return (
    <>
      <p><a href={path.length ? href('sites', s.id, 'gaugings') : href('sites', s.id)}>‹ {path.length ? 'Gaugings of this site' : s.name}</a></p>
      {path[0] === 'new' ? <GaugingEntry site={s} /> : <GaugingsList site={s} />}
    </>
  );
}
