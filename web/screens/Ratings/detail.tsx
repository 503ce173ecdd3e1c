// One rating: its segments, gauged range, fit statistics and note; its shifts; its table; delete with undo.
import { useState } from 'preact/hooks';
import { ratingInForce, type SiteRecord } from '../../../core';
import { deleteRating, ratingsAndGaugings, restoreRating } from '../../db';
import { useRecords } from '../../components/use-records';
import { formatTime } from '../../format';
import { href } from '../../router';
import { rangeText, segmentFormula } from './describe';
import { RatingPlot } from './plot';
import { Shifts } from './shifts';
import { RatingTableView } from './table';

/** The page of one rating. */
export function RatingDetail({ site, ratingId }: { site: SiteRecord; ratingId: string }) {
  const data = useRecords(() => ratingsAndGaugings(site.id), ['rating', 'gauging'], [site.id]);
  const [deleted, setDeleted] = useState(false);
  const u = site.displayUnits;
  if (data.state === 'loading') return <p aria-busy="true">Reading the rating…</p>;
  if (data.state === 'failed') return <p class="callout bad" role="alert">{data.message}</p>;
  const rating = data.value.ratings.find((r) => r.id === ratingId);
  if (deleted || !rating) {
    return (
      <>
        <h2 id="screen-title" tabIndex={-1}>{deleted ? 'Rating deleted' : 'Rating not found'}</h2>
        {deleted && <button type="button" onClick={async () => { await restoreRating(ratingId); setDeleted(false); }}>Undo the deletion</button>}
        <p><a href={href('sites', site.id, 'ratings')}>Ratings of this site</a></p>
      </>
    );
  }
  const inForce = ratingInForce(data.value.ratings, Date.now())?.id === rating.id;
  const table = rating.segments.length > 3;
  // The gaugings of the rating's period (until the next rating) and those it was fitted from.
  const next = data.value.ratings.find((r) => r.validFrom_ms > rating.validFrom_ms);
  const used = new Set(rating.fittedFrom);
  const periodGaugings = data.value.gaugings.filter((g) => used.has(g.id) || (g.time_ms >= rating.validFrom_ms && (!next || g.time_ms < next.validFrom_ms)));
  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>Rating from {formatTime(rating.validFrom_ms, site.timeZone)}</h2>
      <p>{inForce ? <span class="tag in-force">in force now</span> : <span class="muted">not in force now</span>}</p>
      <div class="card">
        {table ? (
          <details>
            <summary class="item">{rating.segments.length} segments (show each)</summary>
            {rating.segments.map((s, i, all) => <p key={i} class="formula">{segmentFormula(all, i, u)}</p>)}
          </details>
        ) : rating.segments.map((s, i, all) => <p key={i} class="formula">{segmentFormula(all, i, u)}</p>)}
        <p class="hint">{rangeText(rating.gaugedRange_m, u)}</p>
        {rating.fit && <p class="hint">Standard error {rating.fit.standardError_pct.toFixed(2)} % from {rating.fit.gaugingCount} gaugings.</p>}
        {rating.fittedFrom.length > 0 && <p class="hint">Fitted from {rating.fittedFrom.length} gaugings of this site.</p>}
        {rating.fit?.warnings.map((w, i) => <p key={i} class="callout warn">{w}</p>)}
        {rating.note && <p>{rating.note}</p>}
      </div>
      <RatingPlot site={site} rating={rating} gaugings={periodGaugings} />
      <Shifts site={site} rating={rating} />
      <RatingTableView site={site} rating={rating} />
      <h3>Delete</h3>
      <button type="button" class="danger wide" onClick={async () => { await deleteRating(rating.id); setDeleted(true); }}>Delete this rating</button>
    </>
  );
}
