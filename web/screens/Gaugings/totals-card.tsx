// The running totals of the verticals kept so far (core mid-section): discharge, area, mean velocity,
// largest subsection share and the count, with the common-practice cautions. In the flow of the page
// (never floating over the form), just above the vertical being typed.
import { MAX_SUBSECTION_SHARE, MIN_VERTICALS, type MidSectionResult, type UnitSystem } from '../../../core';
import { formatQuantity } from '../../format';
import { formatArea_m2 } from '../Ratings/units';

/** Props: the totals (absent until two verticals enclose some area), the count kept, the site's units. */
export function TotalsCard({ totals, count, units }: { totals: MidSectionResult | undefined; count: number; units: UnitSystem }) {
  const maxShare = totals ? Math.max(...totals.subsections.map((s) => s.share)) : 0;
  return (
    <>
      <section class="card running" id="running-totals" aria-live="polite" aria-label="Running totals" data-testid="running-totals">
        {totals ? (
          <dl class="facts">
            <dt>Discharge</dt><dd data-testid="running-discharge">{formatQuantity('discharge', totals.discharge_m3s, units)}</dd>
            <dt>Area</dt><dd>{formatArea_m2(totals.area_m2, units)}</dd>
            <dt>Velocity</dt><dd>{formatQuantity('velocity', totals.meanVelocity_mps, units)}</dd>
            <dt>Largest</dt><dd>{(100 * maxShare).toFixed(1)} %{maxShare > MAX_SUBSECTION_SHARE && <> <span class="tag">over {100 * MAX_SUBSECTION_SHARE} %</span></>}</dd>
            <dt>Verticals</dt><dd>{count}{count < MIN_VERTICALS && <> <span class="tag">under {MIN_VERTICALS}</span></>}</dd>
          </dl>
        ) : <p class="muted">Totals appear once two verticals with depth between them are kept. {count} kept.</p>}
      </section>
      {totals && maxShare > MAX_SUBSECTION_SHARE && <p class="callout warn">A subsection carries {(100 * maxShare).toFixed(1)} % of the discharge; common practice is at most {100 * MAX_SUBSECTION_SHARE} % (ideally 5 %): add verticals there.</p>}
      {totals && count < MIN_VERTICALS && <p class="callout warn" data-testid="count-warning">{count} verticals so far; common practice asks at least {MIN_VERTICALS} (25–30 recommended).</p>}
    </>
  );
}
