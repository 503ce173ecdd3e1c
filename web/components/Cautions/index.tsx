// The cautions every user sees: field safety at high water, and that results are estimates.

/** The two standing cautions, as a short section. `compact` drops the heading for inline use. */
export function Cautions({ compact = false }: { compact?: boolean }) {
  return (
    <section aria-labelledby={compact ? undefined : 'cautions-heading'}>
      {!compact && <h3 id="cautions-heading">Cautions</h3>}
      <p class="callout warn">
        <strong>Safety first at high water.</strong> Do not wade when depth × velocity approaches the wading
        limit (about 0.93 m²/s, 10 ft²/s), when banks are unstable or debris is moving. Follow your
        employer's field safety procedures; no reading is worth a life.
      </p>
      <p class="callout">
        <strong>Results are estimates.</strong> Discharges, baseflow and runoff figures here support quick
        field decisions. Design, flood warning and regulatory reporting follow local codes, approved methods
        and licensed professional practice.
      </p>
    </section>
  );
}
