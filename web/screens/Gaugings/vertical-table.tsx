// The verticals of a gauging as a compact table: units in the header, plain numbers in the cells (so
// nothing wraps at 360 px), with each subsection's share of the discharge from core's mid-section.
import type { ComponentChildren } from 'preact';
import { displayUnit, STAGE_DECIMALS, toDisplay, type MidSectionResult, type UnitSystem } from '../../../core';
import { significant } from '../../format';

/** One row: station, depth (m), mean velocity with its angle coefficient applied (m/s). */
export interface VerticalRow {
  station_m: number;
  depth_m: number;
  velocity_mps: number;
}

/** Props: the rows, their mid-section result (for discharge and share; absent until there is area), units. */
export interface VerticalTableProps {
  rows: readonly VerticalRow[];
  totals: MidSectionResult | undefined;
  units: UnitSystem;
  /** Show each subsection's discharge as well as its share (the read view has room; the entry has buttons). */
  discharge?: boolean;
  /** Which row is being corrected. */
  current?: number;
  /** Buttons at the end of each row (the entry's correct and remove). */
  actions?: (index: number) => ComponentChildren;
  label: string;
}

/** The verticals table inside a scrolling card. */
export function VerticalTable({ rows, totals, units, discharge, current, actions, label }: VerticalTableProps) {
  const l = displayUnit('length', units);
  const len = (x: number) => toDisplay('length', x, units).toFixed(STAGE_DECIMALS[units]);
  const share = (i: number) => (totals ? (100 * totals.subsections[i].share).toFixed(1) : '—');
  return (
    <div class="card table-scroll vertical-table" tabIndex={0} aria-label={label}>
      <table class="verticals" data-testid="verticals">
        <thead>
          <tr>
            <th scope="col">#</th>
            <th scope="col">Station<span class="unit">{l}</span></th>
            <th scope="col">Depth<span class="unit">{l}</span></th>
            <th scope="col">Velocity<span class="unit">{displayUnit('velocity', units)}</span></th>
            {discharge && <th scope="col">Q<span class="unit">{displayUnit('discharge', units)}</span></th>}
            <th scope="col">Share<span class="unit">%</span></th>
            {actions && <th scope="col"><span class="sr-only">Correct or remove</span></th>}
          </tr>
        </thead>
        <tbody>
          {rows.map((v, i) => (
            <tr key={i} aria-current={current === i ? 'true' : undefined}>
              <td>{i + 1}</td>
              <td>{len(v.station_m)}</td>
              <td>{len(v.depth_m)}</td>
              <td>{significant(toDisplay('velocity', v.velocity_mps, units))}</td>
              {discharge && <td>{totals ? significant(toDisplay('discharge', totals.subsections[i].discharge_m3s, units)) : '—'}</td>}
              <td>{share(i)}</td>
              {actions && <td class="actions"><div>{actions(i)}</div></td>}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
