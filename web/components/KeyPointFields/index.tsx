// The four key points of a storm event as wall-clock time fields in the site's zone, with "find again"
// and the polynomial cross-check of the inflection beside the smooth-fit one.
import { useId } from 'preact/hooks';
import { fromLocalInput, toLocalInput, type EventPoints } from '../../../core';
import { formatTime } from '../../format';
import './style.css';

/** The polynomial cross-check of the inflection: its time (UTC ms) or why there is none. */
export type InflectionCrossCheck = { time_ms: number } | { message: string };

/** Props: the points (UTC ms), the site's zone, the readings' span (UTC ms) and the change callback. */
export interface KeyPointFieldsProps {
  value: EventPoints;
  onChange: (next: EventPoints) => void;
  timeZone: string;
  first_ms: number;
  last_ms: number;
  /** True when the points were set by hand (then "find again" has something to undo). */
  edited: boolean;
  onFindAgain: () => void;
  crossCheck?: InflectionCrossCheck;
}

const FIELDS: { key: keyof EventPoints; label: string; hint: string }[] = [
  { key: 'riseStart_ms', label: 'Rise start', hint: 'the last reading before the flow rises' },
  { key: 'peak_ms', label: 'Peak', hint: 'the highest discharge' },
  { key: 'inflection_ms', label: 'Inflection', hint: 'the steepest fall, found by a smooth fit' },
  { key: 'runoffEnd_ms', label: 'End of direct runoff', hint: 'where the recession turns straight on the log plot' },
];

/** Four time fields, one per key point; a typed time replaces that point and calls onChange with all four. */
export function KeyPointFields(props: KeyPointFieldsProps) {
  const id = useId();
  const min = toLocalInput(props.first_ms, props.timeZone);
  const max = toLocalInput(props.last_ms, props.timeZone);
  const change = (key: keyof EventPoints, text: string) => {
    let time_ms: number;
    try {
      time_ms = fromLocalInput(text, props.timeZone);
    } catch (e) {
      // A half-typed or cleared field: keep the last whole time until the field holds a full one.
      if (e instanceof RangeError) return;
      throw e;
    }
    props.onChange({ ...props.value, [key]: time_ms });
  };
  return (
    <fieldset class="key-points">
      <legend>Key points ({props.edited ? 'set by hand' : 'found automatically'})</legend>
      {FIELDS.map((f) => (
        <div key={f.key}>
          <label for={`${id}-${f.key}`}>
            {f.label}
            <span class="hint" id={`${id}-${f.key}-hint`}>{f.hint}</span>
          </label>
          <input
            id={`${id}-${f.key}`}
            type="datetime-local"
            data-point={f.key}
            aria-describedby={`${id}-${f.key}-hint`}
            min={min}
            max={max}
            value={toLocalInput(props.value[f.key], props.timeZone)}
            onChange={(e) => change(f.key, e.currentTarget.value)}
          />
          {f.key === 'inflection_ms' && props.crossCheck && (
            <p class="hint key-points-check" data-testid="inflection-cross-check">
              {'time_ms' in props.crossCheck
                ? `Polynomial cross-check: ${formatTime(props.crossCheck.time_ms, props.timeZone)}`
                : `Polynomial cross-check: none (${props.crossCheck.message})`}
            </p>
          )}
        </div>
      ))}
      <button type="button" class="wide key-points-again" onClick={props.onFindAgain}>
        Find key points again
      </button>
    </fieldset>
  );
}
