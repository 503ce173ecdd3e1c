// A site's ratings: the list by the date each applies from (newest first, the one in force marked), and
// the ways to add one: by hand, fitted to gaugings, or from a table file. Sub-pages by route.
import { ratingInForce, type RatingRecord, type SiteRecord } from '../../../core';
import { getSite, ratingsAndGaugings } from '../../db';
import { useRecords } from '../../components/use-records';
import { formatTime } from '../../format';
import { href, type ScreenProps } from '../../router';
import { rangeText, segmentFormula } from './describe';
import { RatingEntry } from './entry';
import { FitRating } from './fit';
import { ImportTable } from './import';
import { RatingDetail } from './detail';
import './style.css';

/** The ratings list of one site. */
function RatingsList({ site }: { site: SiteRecord }) {
  const data = useRecords(() => ratingsAndGaugings(site.id), ['rating', 'gauging'], [site.id]);
  const u = site.displayUnits;
  if (data.state === 'loading') return <p aria-busy="true">Reading the ratings…</p>;
  if (data.state === 'failed') return <p class="callout bad" role="alert">The ratings could not be read: {data.message}</p>;
  const { ratings, gaugings } = data.value;
  const inForce = ratingInForce(ratings, Date.now());
  const newest: RatingRecord[] = [...ratings].reverse();
  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>Ratings of {site.name}</h2>
      <p class="muted">{site.code} · {site.timeZone}</p>
      <div class="row">
        <a class="button primary" href={href('sites', site.id, 'ratings', 'new')}>Enter by hand</a>
        <a class="button" href={href('sites', site.id, 'ratings', 'fit')}>Fit to gaugings</a>
        <a class="button" href={href('sites', site.id, 'ratings', 'import')}>Import a table</a>
      </div>
      <p>
        <a href={href('sites', site.id, 'gaugings')}>{gaugings.length} gauging{gaugings.length === 1 ? '' : 's'} of this site</a>
      </p>
      {newest.length === 0 ? (
        <p class="callout warn">No rating yet: readings stay stage only until one is added. Enter one by hand, fit one to this site’s gaugings or import the office’s table.</p>
      ) : (
        <ul class="list card" aria-label="Ratings, newest first">
          {newest.map((r) => (
            <li key={r.id}>
              <a class="item" href={href('sites', site.id, 'ratings', r.id)}>
                <span>
                  <strong>From {formatTime(r.validFrom_ms, site.timeZone)}</strong>
                  {r.id === inForce?.id && <> <span class="tag in-force">in force</span></>}
                  {r.segments.length <= 3 ? (
                    r.segments.map((s, i) => <span key={i} class="hint formula">{segmentFormula(r.segments, i, u)}</span>)
                  ) : (
                    <span class="hint">{r.segments.length} segments</span>
                  )}
                  <span class="hint">
                    {rangeText(r.gaugedRange_m, u)}
                    {r.fit && ` · standard error ${r.fit.standardError_pct.toFixed(1)} % from ${r.fit.gaugingCount} gaugings`}
                    {r.shifts.length > 0 && ` · ${r.shifts.length} dated shift${r.shifts.length > 1 ? 's' : ''}`}
                  </span>
                  {r.note && <span class="hint">{r.note}</span>}
                </span>
                <span aria-hidden="true">›</span>
              </a>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}

/** The ratings area of a site: list, hand entry, fit, table import, or one rating, by the path after "ratings". */
export default function Ratings({ route, params }: ScreenProps) {
  const siteId = params.siteId;
  // The part of the path after "ratings": [] for the list, ['new'], ['fit'], ['import'] or [ratingId].
  const path = route.segments.slice(3);
  const site = useRecords(() => getSite(siteId), ['site'], [siteId]);
  if (site.state === 'loading') return <p aria-busy="true">Opening the site…</p>;
  if (site.state === 'failed') return <p class="callout bad" role="alert">{site.message}</p>;
  if (!site.value) {
    return (
      <>
        <h2 id="screen-title" tabIndex={-1}>Site not found</h2>
        <p>This site is not on this phone. <a href={href('sites')}>Back to the sites</a></p>
      </>
    );
  }
  const s = site.value;
  const back = <p><a href={path.length ? href('sites', s.id, 'ratings') : href('sites', s.id)}>‹ {path.length ? 'Ratings of this site' : s.name}</a></p>;
  const [first] = path;
  return (
    <>
      {back}
      {first === undefined && <RatingsList site={s} />}
      {first === 'new' && <RatingEntry site={s} />}
      {first === 'fit' && <FitRating site={s} />}
      {first === 'import' && <ImportTable site={s} />}
      {first !== undefined && !['new', 'fit', 'import'].includes(first) && <RatingDetail site={s} ratingId={first} />}
    </>
  );
}
