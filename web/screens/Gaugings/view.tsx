// One saved gauging read back: its figures, how it checks the rating in force at its time, and every
// vertical with the width, discharge and share of the subsection it stands for (core mid-section),
// with the way to correct it (a new revision; the earlier one stays in the record's history) or delete it.
import { useMemo } from 'preact/hooks';
import { midSection, type GaugingRecord, type RatingRecord, type SiteRecord } from '../../../core';
import { deleteGauging } from '../../db';
import { formatQuantity, formatTime } from '../../format';
import { href, navigate } from '../../router';
import { formatArea_m2 } from '../Ratings/units';
import { gaugingCheck } from './check';
import { VerticalTable } from './vertical-table';
import { Photos } from '../../components/Photos';

/** Grade words with the common-practice limit of each. */
export const GRADE_WORDS = { excellent: 'excellent (2 %)', good: 'good (5 %)', fair: 'fair (8 %)', poor: 'poor (over 8 %)' } as const;

const VELOCITY_WORDS = { 'six-tenths': 'at 0.6 depth', 'two-point': 'at 0.2 and 0.8 depth', 'three-point': 'at 0.2, 0.6 and 0.8 depth' } as const;

/** The read view of gauging g of site. */
export function GaugingView({ site, gauging: g, ratings }: { site: SiteRecord; gauging: GaugingRecord; ratings: readonly RatingRecord[] }) {
  const u = site.displayUnits;
  const c = gaugingCheck(g, ratings);
  const totals = useMemo(() => {
    if (!g.verticals || g.verticals.length < 2) return undefined;
    try {
      return midSection(g.verticals);
    } catch {
      // A record from elsewhere with verticals that enclose no area: shown without subsection figures.
      return undefined;
    }
  }, [g]);
  const kinds = new Set((g.verticals ?? []).map((v) => v.observed?.kind).filter((k) => k !== undefined));
  async function remove() {
    await deleteGauging(g.id);
    navigate(href('sites', site.id, 'gaugings'));
  }
  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>Gauging of {formatTime(g.time_ms, site.timeZone)}</h2>
      <section class="card" aria-label="Figures">
        <dl class="facts">
          <dt>Discharge</dt><dd data-testid="view-discharge">{formatQuantity('discharge', g.discharge_m3s, u)}</dd>
          <dt>Mean stage</dt><dd>{formatQuantity('stage', g.meanStage_m, u)}</dd>
          {totals && <><dt>Area</dt><dd>{formatArea_m2(totals.area_m2, u)}</dd></>}
          {totals && <><dt>Width</dt><dd>{formatQuantity('length', totals.width_m, u)}</dd></>}
          {totals && <><dt>Velocity</dt><dd>{formatQuantity('velocity', totals.meanVelocity_mps, u)}</dd></>}
          <dt>Grade</dt><dd>{GRADE_WORDS[g.grade]}</dd>
          {g.observer && <><dt>Observer</dt><dd>{g.observer}</dd></>}
        </dl>
        {c ? (
          <p data-testid="view-check">
            {c.deviation_pct > 0 ? '+' : ''}{c.deviation_pct.toFixed(1)} % from the rating ({formatQuantity('discharge', c.rated_m3s, u)}): {c.checks ? 'checks' : 'does not check'} within its grade; it implies a shift of {formatQuantity('stage', c.impliedShift_m, u)}.
          </p>
        ) : <p class="muted">No rating in force at its time to compare with.</p>}
        {g.note && <p>Note: {g.note}</p>}
      </section>
      <div class="row">
        <a class="button primary" href={href('sites', site.id, 'gaugings', g.id, 'edit')}>Correct</a>
        <button type="button" class="danger" onClick={() => void remove()}>Delete</button>
      </div>
      {g.verticals && g.verticals.length > 0 ? (
        <>
          <h3>{g.verticals.length} verticals</h3>
          <p class="hint">
            Velocity is the mean in the vertical{kinds.size > 0 && ` (measured ${[...kinds].map((k) => VELOCITY_WORDS[k]).join('; ')})`} times its angle coefficient;
            Q and share are the subsection each vertical stands for (mid-section method).
          </p>
          <VerticalTable
            label="Verticals of this gauging"
            rows={g.verticals.map((v) => ({ station_m: v.station_m, depth_m: v.depth_m, velocity_mps: v.velocity_mps * (v.angleCoefficient ?? 1) }))}
            totals={totals}
            units={u}
            discharge
          />
        </>
      ) : <p class="muted">Entered as a summary ({g.method}): no verticals to show.</p>}
      <Photos siteId={site.id} owner={{ kind: 'gauging', id: g.id }} timeZone={site.timeZone} />
    </>
  );
}
