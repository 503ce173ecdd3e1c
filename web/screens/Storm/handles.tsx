// The key points as large handles on the plot: drag with a finger or a mouse, arrow keys move the focused
// handle one reading a step; the plain name shows while a handle is dragged or has keyboard focus. Where
// two would overlap one moves aside (handle-layout.ts) and a stem joins it to its point.
import { useRef, useState } from 'preact/hooks';
import type { EventPoints } from '../../../core';
import type { PlotGeometry } from '../../components/Plot';
import { formatTime } from '../../format';
import { clockLabel, dayLabel } from '../../components/Plot/time-axis';
import { placeHandles } from './handle-layout';
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

/** Four handles positioned over the plot, each wholly inside it and never over another. */
export function KeyPointHandles({ geometry, points, time_ms, y, timeZone, onMove, onStep }: HandlesProps) {
  const [active, setActive] = useState<KeyPoint>();
  // How far (CSS px) the finger is from the point it holds: a handle set aside from its point moves the
  // point by as much as the finger moves, never jumping to where the finger is.
  const grab = useRef(0);
  const { area } = geometry;
  const shown = KEY_ORDER.map((key) => ({ key, x: geometry.xToPx(points[key]), i: nearestIndex(time_ms, points[key]) }))
    .filter((h) => Number.isFinite(h.x) && h.x >= area.left - 1 && h.x <= area.left + area.width + 1);
  const spots = placeHandles(shown.map((h) => ({ key: h.key, x: h.x, y: geometry.yToPx(y[h.i]) })), area);
  return (
    <>
      {spots.some((p) => p.x !== p.pointX || p.y !== p.pointY) && (
        <svg class="key-stems" aria-hidden="true" width="100%" height="100%">
          {spots.map((p) => (p.x !== p.pointX || p.y !== p.pointY) && <line key={p.key} x1={p.pointX} y1={p.pointY} x2={p.x} y2={p.y} />)}
        </svg>
      )}
      {spots.map(({ key, x: left, y: top, pointX }) => {
        const t = points[key];
        const i = shown.find((h) => h.key === key)!.i;
        const when = formatTime(t, timeZone);
        const place = `${left > area.left + area.width / 2 ? ' name-left' : ''}${top < area.top + area.height / 2 ? ' name-below' : ''}`;
        return (
          <button
            key={key}
            type="button"
            role="slider"
            class={`key-handle${active === key ? ' active' : ''}${place}`}
            data-handle={key}
            data-point-x={pointX.toFixed(1)}
            style={{ left: `${left}px`, top: `${top}px` }}
            aria-label={KEY_NAMES[key]}
            aria-valuemin={0}
            aria-valuemax={time_ms.length - 1}
            aria-valuenow={i}
            aria-valuetext={`${KEY_NAMES[key]} at ${when}`}
            onPointerDown={(e) => {
              e.stopPropagation();
              e.currentTarget.setPointerCapture?.(e.pointerId);
              e.currentTarget.focus({ preventScroll: true });
              grab.current = pointX - (e.clientX - e.currentTarget.parentElement!.getBoundingClientRect().left);
              setActive(key);
            }}
            onPointerMove={(e) => {
              if (active !== key) return;
              e.stopPropagation();
              const box = e.currentTarget.parentElement!.getBoundingClientRect();
              onMove(key, geometry.pxToX(e.clientX - box.left + grab.current));
            }}
            // The name shows while the finger is down (and for keyboard focus), never after the drag.
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
