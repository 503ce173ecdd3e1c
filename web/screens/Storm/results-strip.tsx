// The figures that stay in view under the plot: direct runoff volume with its range, depth, peak,
// baseflow index and runoff coefficient, and the rainfall to type. Extrapolated figures are marked.
import { displayUnit, fromDisplay, roundDown, roundUp, toDisplay, type EventSummary, type UnitSystem } from '../../../core';
import { formatQuantity, significant } from '../../format';
import { roundAbout, type RunoffRange } from './runoff-range';

/** Props: the summary (SI), the range, which figures are extrapolated, units, rainfall text and its problem. */
export interface ResultsStripProps {
  summary: EventSummary;
  range?: RunoffRange;
  peakExtrapolated: boolean;
  volumeExtrapolated: boolean;
  units: UnitSystem;
  hasArea: boolean;
  rainfall: string;
  rainfallProblem?: string;
  onRainfall: (text: string) => void;
}

function Mark({ on, short }: { on: boolean; short?: boolean }) {
  if (!on) return null;
  return (
    <span class="ext-mark" title="Uses discharges beyond the rating's gauged range" data-testid="extrapolated-mark">
      {short ? <abbr title="extrapolated" aria-label="extrapolated">ext.</abbr> : 'extrapolated'}
    </span>
  );
}

/** "about 340,000 m³ (250,000–400,000)": the volume to two significant figures, the ends as the core rounded them (outward). */
export function rangeText(range: RunoffRange, units: UnitSystem): string {
  const unit = displayUnit('volume', units);
  const v = (x: number) => formatQuantity('volume', x, units);
  const bare = (x: number) => v(x).replace(` ${unit}`, '');
  // In other units the ends are converted, then rounded outward again so the conversion cannot narrow them.
  const low = units === 'metric' ? range.low_m3 : fromDisplay('volume', roundDown(toDisplay('volume', range.low_m3, units)), units);
  const high = units === 'metric' ? range.high_m3 : fromDisplay('volume', roundUp(toDisplay('volume', range.high_m3, units)), units);
  return `about ${v(roundAbout(range.volume_m3))} (${bare(low)}–${bare(high)})`;
}

/** What the range holds, in a few plain words for beside it: the band, the methods, the widening, the default. */
export function rangeHolds(range: RunoffRange): string {
  const parts = [`rating ±${range.rating.band} standard error${range.rating.band === 1 ? ' (about 68 %)' : 's (about 95 %)'}`];
  if (range.rating.isDefault) parts[0] += `, ${range.rating.standardError_pct} % assumed: the rating has no fit statistics`;
  parts.push(`${range.methods.used.length} method${range.methods.used.length === 1 ? '' : 's'}`);
  if (range.methods.leftOut.length > 0) parts.push(`${range.methods.leftOut.length} left out`);
  if (range.keyPoints) parts.push('key points moved');
  if (range.rating.extrapolatedShare > 0) parts.push('widened for discharges beyond the gauged range');
  return `Range holds: ${parts.join('; ')}.`;
}

/** The strip of figures. */
export function ResultsStrip(p: ResultsStripProps) {
  const s = p.summary;
  const c = s.runoffCoefficient;
  return (
    <section class="results-strip" aria-label="Storm figures">
      <div class="strip-lead">
        <span class="strip-label">Direct runoff</span>
        <span class="figure" data-testid="direct-volume">{formatQuantity('volume', s.directVolume_m3, p.units)}</span>
        <Mark on={p.volumeExtrapolated} />
      </div>
      {p.range && (
        <p class="strip-range" data-testid="volume-range">
          {rangeText(p.range, p.units)}
        </p>
      )}
      {p.range && (
        <p class="strip-range-holds" data-testid="range-holds">
          {rangeHolds(p.range)}
        </p>
      )}
      <dl class="strip-cells">
        <div>
          <dt>Depth</dt>
          <dd data-testid="runoff-depth">{s.runoffDepth_mm === undefined ? 'needs area' : formatQuantity('depth', s.runoffDepth_mm, p.units)}</dd>
        </div>
        <div>
          <dt>Peak</dt>
          <dd data-testid="peak">
            {formatQuantity('discharge', s.peak_m3s, p.units)}
            <Mark on={p.peakExtrapolated} short />
          </dd>
        </div>
        <div>
          <dt>BFI</dt>
          <dd data-testid="baseflow-index">{significant(s.baseflowIndex, 2)}</dd>
        </div>
        <div>
          <dt>Coeff.</dt>
          <dd data-testid="runoff-coefficient" class={c !== undefined && c > 1 ? 'over' : undefined}>
            {c === undefined ? (p.hasArea ? 'add rain' : 'needs area') : significant(c, 2)}
          </dd>
        </div>
        <div class="strip-rain">
          <dt>
            <label for="storm-rain">Rain ({displayUnit('depth', p.units)})</label>
          </dt>
          <dd>
            <input
              id="storm-rain"
              inputMode="decimal"
              autocomplete="off"
              aria-invalid={p.rainfallProblem ? true : undefined}
              value={p.rainfall}
              onInput={(e) => p.onRainfall(e.currentTarget.value)}
            />
          </dd>
        </div>
      </dl>
      {p.rainfallProblem && <p class="callout warn strip-note" role="alert">{p.rainfallProblem}</p>}
      {c !== undefined && c > 1 && (
        <p class="callout warn strip-note" role="alert" data-testid="coefficient-warning">
          More runoff than rain (coefficient {significant(c, 2)}): check the rainfall, the catchment area or the rating.
        </p>
      )}
    </section>
  );
}
