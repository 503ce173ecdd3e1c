// Every method side by side on this storm: volume and depth of each, the chosen one marked, and the spread.
import type { UnitSystem } from '../../../core';
import { METHOD_LABELS, type MethodKind } from '../../components/SeparationPicker';
import { formatQuantity } from '../../format';
import type { MethodOutcome, MethodSpread } from './method-table';
import { rangeText } from './results-strip';
import type { RunoffRange } from './runoff-range';

/** Props: every method's outcome, their spread, the chosen method, units, and the range with what it holds. */
export interface MethodSpreadProps {
  rows: MethodOutcome[];
  spread?: MethodSpread;
  chosen: MethodKind;
  units: UnitSystem;
  range?: RunoffRange;
}

/** One tap opens the table of every method, the sentence with its spread and where the range comes from. */
export function MethodSpreadTable({ rows, spread, chosen, units, range }: MethodSpreadProps) {
  return (
    <details class="card method-spread" data-testid="method-spread-card">
      <summary>
        Every method{spread ? `: ${formatQuantity('volume', spread.low_m3, units)} to ${formatQuantity('volume', spread.high_m3, units)}` : ''}
      </summary>
      {range && (
        <div data-testid="range-sentence">
          <p>Direct runoff {rangeText(range, units)}. The range holds:</p>
          <ul>
            {range.sentences.map((s) => (
              <li key={s}>{s}</li>
            ))}
          </ul>
        </div>
      )}
      {spread && (
        <p data-testid="method-spread">
          {spread.count} methods give {formatQuantity('volume', spread.low_m3, units)} ({METHOD_LABELS[spread.lowKind]}) to{' '}
          {formatQuantity('volume', spread.high_m3, units)} ({METHOD_LABELS[spread.highKind]}).
        </p>
      )}
      <table data-testid="method-table">
        <thead>
          <tr>
            <th scope="col">Method</th>
            <th scope="col">Direct runoff</th>
            <th scope="col">Depth</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.kind} data-method={r.kind} class={r.kind === chosen ? 'chosen' : undefined}>
              <th scope="row">
                {METHOD_LABELS[r.kind]}{r.kind === chosen ? ' (chosen)' : ''}
                {r.leftOut && r.volume_m3 !== undefined && <span class="left-out" data-testid="left-out"> Not in the range: {r.leftOut}</span>}
              </th>
              {r.volume_m3 === undefined ? (
                <td colSpan={2} class="problem">{r.problem}</td>
              ) : (
                <>
                  <td data-testid="spread-volume">{formatQuantity('volume', r.volume_m3, units)}</td>
                  <td>{r.depth_mm === undefined ? '—' : formatQuantity('depth', r.depth_mm, units)}</td>
                </>
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </details>
  );
}
