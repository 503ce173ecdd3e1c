// The key points as large handles on the plot: drag with a finger or a mouse, arrow keys move the focused
// handle one reading a step; the plain name shows while a handle is dragged or has keyboard focus.
import { useState } from 'preact/hooks';
import type { EventPoints } from '../../../core';
import type { PlotGeometry } from '../../components/Plot';
import { formatTime } from '../../format';
import { clockLabel, dayLabel } from '../../components/Plot/time-axis';
import { KEY_NAMES, KEY_ORDER, nearestIndex, type KeyPoint } from './key-point-order';

/** Props: the plot's geometry, the points (UTC ms), the series (times, y in display units) and callbacks. */
export interface HandlesProps {
  geometry: PlotGeometry;
  points: EventPoints;
  time_ms: Float64Array;
  /** The discharge line in display units (what the handles sit on). */
  y: ArrayLike<number>;
  timeZone: string;
  onMove: (key: KeyPoint, to_ms: number) => void;
  onStep: (key: KeyPoint, steps: number) => void;
}

const LETTERS: Record<KeyPoint, string> = { riseStart_ms: 'R', peak_ms: 'P', inflection_ms: 'I', runoffEnd_ms: 'E' };

/** Four handles positioned over the plot. */
export function KeyPointHandles({ geometry, points, time_ms, y, timeZone, onMove, onStep }: HandlesProps) {
  const [active, setActive] = useState<KeyPoint>();
  const { area } = geometry;
  return (
    <>
      {KEY_ORDER.map((key) => {
        const t = points[key];
        const i = nearestIndex(time_ms, t);
        const left = geometry.xToPx(t);
        const top = geometry.yToPx(y[i]);
        if (!Number.isFinite(left) || left < area.left - 1 || left > area.left + area.width + 1) return null;
        const clampedTop = Math.max(area.top, Math.min(area.top + area.height, Number.isFinite(top) ? top : area.top + area.height));
        const when = formatTime(t, timeZone);
        return (
          <button
            key={key}
            type="button"
            role="slider"
            class={`key-handle${active === key ? ' active' : ''}${left > area.left + area.width / 2 ? ' name-left' : ''}`}
            data-handle={key}
            style={{ left: `${left}px`, top: `${clampedTop}px` }}
            aria-label={KEY_NAMES[key]}
            aria-valuemin={0}
            aria-valuemax={time_ms.length - 1}
            aria-valuenow={i}
            aria-valuetext={`${KEY_NAMES[key]} at ${when}`}
            onPointerDown={(e) => {
              e.stopPropagation();
              e.currentTarget.setPointerCapture?.(e.pointerId);
              e.currentTarget.focus({ preventScroll: true });
              setActive(key);
            }}
            onPointerMove={(e) => {
              if (active !== key) return;
              e.stopPropagation();
              const box = e.currentTarget.parentElement!.getBoundingClientRect();
              onMove(key, geometry.pxToX(e.clientX - box.left));
            }}
            onPointerUp={() => setActive(undefined)}
            onPointerCancel={() => setActive(undefined)}
            onKeyDown={(e) => {
              const steps = e.key === 'ArrowLeft' || e.key === 'ArrowDown' ? -1 : e.key === 'ArrowRight' || e.key === 'ArrowUp' ? 1 : 0;
              if (steps === 0) return;
              e.preventDefault();
              onStep(key, steps);
            }}
          >
            <span class="key-dot" aria-hidden="true">{LETTERS[key]}</span>
            <span class="key-name" aria-hidden="true">{`${KEY_NAMES[key]} ${dayLabel(t, timeZone)} ${clockLabel(t, timeZone)}`}</span>
          </button>
        );
      })}
    </>
  );
}
