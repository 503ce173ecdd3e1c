// The storms found in the site's recent record, newest first; tapping one opens it.
import type { UnitSystem } from '../../../core';
import { formatQuantity, formatTime } from '../../format';
import type { StormFound } from '../../../core';

/** Props: the storms (newest first), which is open, units, zone, the days searched up to the latest reading (UTC ms). */
export interface StormListProps {
  storms: StormFound[];
  openPeak_ms?: number;
  units: UnitSystem;
  timeZone: string;
  days: number;
  last_ms: number;
  onOpen: (storm: StormFound) => void;
}

/** The list of storms, open (every storm in view; it folds away on a tap); "no storm" is said plainly. */
export function StormList({ storms, openPeak_ms, units, timeZone, days, last_ms, onOpen }: StormListProps) {
  const upTo = formatTime(last_ms, timeZone);
  if (storms.length === 0) {
    return (
      <p class="callout" data-testid="no-storm">
        No storm in the {days} days to {upTo} (the latest reading): the flow never rose clearly above its level before.
        Choose a window below to look at any stretch of the record.
      </p>
    );
  }
  return (
    <details class="storm-list" open>
      <summary>
        {storms.length === 1 ? 'One storm' : `${storms.length} storms`} in the {days} days to {upTo}
      </summary>
      <p class="hint">Found where the record is continuous; figures as each storm opens (its key points as found, the first method).</p>
      <ul class="list" data-testid="storm-list">
        {storms.map((s) => {
          const open = s.points.peak_ms === openPeak_ms;
          return (
            <li key={s.points.peak_ms} class="item">
              <button type="button" class="storm-pick" aria-current={open ? 'true' : undefined} onClick={() => onOpen(s)}>
                <strong>{formatTime(s.points.peak_ms, timeZone)}</strong>
                <span>
                  Peak {formatQuantity('discharge', s.peak_m3s, units)} · {s.duration_days.toFixed(1)} days
                  {s.depth_mm !== undefined ? ` · ${formatQuantity('depth', s.depth_mm, units)}` : ''}
                </span>
              </button>
            </li>
          );
        })}
      </ul>
    </details>
  );
}
