// The figures of a storm event in the site's units: peak, volumes, runoff depth, baseflow index and
// runoff coefficient. Every number has its unit; a missing one says what it needs.
import type { EventSummary, UnitSystem } from '../../../core';
import { formatQuantity, formatTime, significant } from '../../format';
import './style.css';

/** Props: the core's event summary (SI), the site's units and zone, and what is missing for the optional figures. */
export interface EventFiguresProps {
  summary: EventSummary;
  units: UnitSystem;
  timeZone: string;
  /** Why there is no runoff depth (e.g. the site has no catchment area), shown in its place. */
  depthMissing?: string;
  /** Why there is no runoff coefficient (e.g. no rainfall entered), shown in its place. */
  coefficientMissing?: string;
}

/** A ratio (0–1+) as "0.114 (11 %)": the ratio and the same as a percentage. */
function ratio(x: number): string {
  return `${significant(x)} (${Math.round(x * 100)} %)`;
}

/** The event's figures as a definition list, the direct runoff volume first and large. */
export function EventFigures({ summary, units, timeZone, depthMissing, coefficientMissing }: EventFiguresProps) {
  return (
    <div class="event-figures">
      <p class="event-figures-lead">
        <span class="muted">Direct runoff volume</span>
        <span class="figure" data-testid="direct-volume">{formatQuantity('volume', summary.directVolume_m3, units)}</span>
      </p>
      <dl class="facts">
        <dt>Runoff depth</dt>
        <dd data-testid="runoff-depth">
          {summary.runoffDepth_mm === undefined ? depthMissing ?? '—' : formatQuantity('depth', summary.runoffDepth_mm, units)}
        </dd>
        <dt>Peak discharge</dt>
        <dd data-testid="peak">
          {formatQuantity('discharge', summary.peak_m3s, units)} at {formatTime(summary.peakTime_ms, timeZone)}
        </dd>
        <dt>Total volume</dt>
        <dd data-testid="total-volume">{formatQuantity('volume', summary.totalVolume_m3, units)}</dd>
        <dt>Baseflow volume</dt>
        <dd data-testid="baseflow-volume">{formatQuantity('volume', summary.baseflowVolume_m3, units)}</dd>
        <dt>Baseflow index</dt>
        <dd data-testid="baseflow-index">{ratio(summary.baseflowIndex)}</dd>
        <dt>Runoff coefficient</dt>
        <dd data-testid="runoff-coefficient">
          {summary.runoffCoefficient === undefined ? coefficientMissing ?? '—' : ratio(summary.runoffCoefficient)}
        </dd>
      </dl>
    </div>
  );
}
