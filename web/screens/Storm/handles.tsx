// The key points as large handles on the plot: drag with a finger or a mouse, arrow keys move the focused
// handle one reading a step. Each 44 px target sits on its point when there is room; where targets would
// overlap they are set aside (handle-layout.ts) and a leader line joins each to its point. A drag moves
// the point of the target touched by as much as the finger moves (pointer capture keeps it that handle's
// drag, wherever the layout then puts the target). The point's name and time show inside the plotting
// area while a handle is dragged or has keyboard focus, and never after.
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

/** A target further than this from its point (CSS px) gets a leader line. */
const LEADER_MIN_PX = 3;

/** The handles of the key points in view, over the plot. */
export function KeyPointHandles({ geometry, points, time_ms, y, timeZone, onMove, onStep }: HandlesProps) {
  const [active, setActive] = useState<KeyPoint>();
  const [keyboard, setKeyboard] = useState<KeyPoint>();
  // How far (CSS px) the finger is from the point it holds, so the point moves with the finger and never jumps.
  const grab = useRef(0);
  // Set while a press moves the focus, so a focus given by a finger or a mouse never shows the name.
  const pressing = useRef(false);
  const { area } = geometry;
  const shown = KEY_ORDER.map((key) => ({ key, i: nearestIndex(time_ms, points[key]), x: geometry.xToPx(points[key]) })).filter(
    (h) => Number.isFinite(h.x) && h.x >= area.left - 1 && h.x <= area.left + area.width + 1,
  );
  const spots = placeHandles(shown.map((h) => ({ key: h.key, x: h.x, y: geometry.yToPx(y[h.i]) })), area);
  const named = spots.find((s) => s.key === (active ?? keyboard));
  const leaders = spots.filter((s) => Math.hypot(s.x - s.pointX, s.y - s.pointY) > LEADER_MIN_PX);
  return (
    <>
      {leaders.length > 0 && (
        <svg class="key-leaders" aria-hidden="true" width="100%" height="100%">
          {leaders.map((s) => (
            <g key={s.key}>
              <line x1={s.pointX} y1={s.pointY} x2={s.x} y2={s.y} />
              <circle cx={s.pointX} cy={s.pointY} r={3} />
            </g>
          ))}
        </svg>
      )}
      {spots.map(({ key, x, y: top, pointX }) => {
        const t = points[key];
        const i = shown.find((h) => h.key === key)!.i;
        return (
          <button
            key={key}
            type="button"
            role="slider"
            class={`key-handle${active === key || keyboard === key ? ' active' : ''}`}
            data-handle={key}
            data-point-x={pointX.toFixed(1)}
            style={{ left: `${x}px`, top: `${top}px` }}
            aria-label={KEY_NAMES[key]}
            aria-valuemin={0}
            aria-valuemax={time_ms.length - 1}
            aria-valuenow={i}
            aria-valuetext={`${KEY_NAMES[key]} at ${formatTime(t, timeZone)}`}
            onPointerDown={(e) => {
              e.stopPropagation();
              e.currentTarget.setPointerCapture?.(e.pointerId);
              grab.current = pointX - (e.clientX - e.currentTarget.parentElement!.getBoundingClientRect().left);
              setKeyboard(undefined);
              pressing.current = true;
              e.currentTarget.focus({ preventScroll: true });
              pressing.current = false;
              setActive(key);
            }}
            onPointerMove={(e) => {
              if (active !== key) return;
              e.stopPropagation();
              const box = e.currentTarget.parentElement!.getBoundingClientRect();
              onMove(key, geometry.pxToX(e.clientX - box.left + grab.current));
            }}
            onPointerUp={() => setActive(undefined)}
            onPointerCancel={() => setActive(undefined)}
            onFocus={(e) => !pressing.current && e.currentTarget.matches(':focus-visible') && setKeyboard(key)}
            onBlur={() => setKeyboard(undefined)}
            onKeyDown={(e) => {
              const steps = e.key === 'ArrowLeft' || e.key === 'ArrowDown' ? -1 : e.key === 'ArrowRight' || e.key === 'ArrowUp' ? 1 : 0;
              if (steps === 0) return;
              e.preventDefault();
              setKeyboard(key);
              onStep(key, steps);
            }}
          >
            <span class="key-dot" aria-hidden="true">{LETTERS[key]}</span>
          </button>
        );
      })}
      {named && (
        // Inside the plotting area, on the half away from the handle, so it never hides the handle or an axis.
        <span
          class={`key-name${named.x > area.left + area.width / 2 ? ' at-left' : ' at-right'}`}
          data-testid="key-name"
          aria-hidden="true"
          style={{
            left: `${area.left + 4}px`,
            width: `${area.width - 8}px`,
            top: named.y > area.top + area.height / 2 ? `${area.top + 4}px` : `${area.top + area.height - 26}px`,
          }}
        >
          <span>{`${KEY_NAMES[named.key]} ${dayLabel(points[named.key], timeZone)} ${clockLabel(points[named.key], timeZone)}`}</span>
        </span>
      )}
    </>
  );
}
