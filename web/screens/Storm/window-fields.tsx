// The readings window as two wall-clock fields in the site's zone, folded away until wanted.
import { useState } from 'preact/hooks';
import { fromLocalInput, toLocalInput } from '../../../core';
import type { TimeWindow } from './draft';

/** Props: the window (UTC ms), the site's zone, the change callback and how many readings it holds. */
export interface WindowFieldsProps {
  window: TimeWindow;
  timeZone: string;
  onChange: (next: TimeWindow) => void;
  count?: number;
}

/** From and To fields; a window that ends before it starts is refused with a sentence and changes nothing. */
export function WindowFields({ window: win, timeZone, onChange, count }: WindowFieldsProps) {
  const [problem, setProblem] = useState<string>();
  const set = (which: keyof TimeWindow, text: string) => {
    let time_ms: number;
    try {
      time_ms = fromLocalInput(text, timeZone);
    } catch (e) {
      if (e instanceof RangeError) return; // half-typed: wait for a whole time
      throw e;
    }
    const next = { ...win, [which]: time_ms };
    if (!(next.to_ms > next.from_ms)) {
      setProblem('The window must end after it starts.');
      return;
    }
    setProblem(undefined);
    onChange(next);
  };
  return (
    <details class="card storm-window-card">
      <summary>Readings window ({timeZone})</summary>
      <div class="storm-window">
        <div>
          <label for="storm-from">From</label>
          <input id="storm-from" type="datetime-local" value={toLocalInput(win.from_ms, timeZone)} onChange={(e) => set('from_ms', e.currentTarget.value)} />
        </div>
        <div>
          <label for="storm-to">To</label>
          <input id="storm-to" type="datetime-local" value={toLocalInput(win.to_ms, timeZone)} onChange={(e) => set('to_ms', e.currentTarget.value)} />
        </div>
      </div>
      {problem && <p class="callout warn" role="alert">{problem}</p>}
      {count !== undefined && <p class="hint">{count} readings with discharge in this window.</p>}
    </details>
  );
}
