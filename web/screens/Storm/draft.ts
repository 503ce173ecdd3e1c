// The storm screen's draft: what the user chose for one site. Derived numbers are never kept here.
import { toDisplay, type AnalysisRecord, type EventPoints, type UnitSystem } from '../../../core';
import type { MethodKind } from '../../components/SeparationPicker';
import { movePoint, stepPoint, type KeyPoint } from './key-point-order';
import { choiceOf, defaultMethodChoice, type MethodChoice } from './method-choice';

/** A time window, UTC ms, from ≤ to. */
export interface TimeWindow {
  from_ms: number;
  to_ms: number;
}

/** The user's choices for one site's storm analysis. */
export interface StormDraft {
  /** The readings window; undefined means the window of the newest storm found. */
  window?: TimeWindow;
  /** Key points set by the user (UTC ms); undefined means the ones the core finds. */
  points?: EventPoints;
  method: MethodChoice;
  /** Rainfall depth as typed, in the site's depth unit (mm or in). */
  rainfall: string;
  note: string;
  /** Why the last move of a key point stopped short, as a plain sentence. */
  stopped?: string;
  /** The id of the saved analysis this draft was opened from. */
  reopened?: string;
}

/** Every change the screen can make to its draft. */
export type StormAction =
  /** A new readings window: key points set by hand no longer apply to it and are dropped. */
  | { type: 'window'; window: TimeWindow }
  /** Open a storm from the list: its window, with the key points the core finds there. */
  | { type: 'storm'; window: TimeWindow }
  /** Key points set whole (the time fields). */
  | { type: 'points'; points: EventPoints }
  /** A handle dragged to a time (UTC ms) over the readings' times; it stops at its neighbours. */
  | { type: 'move'; key: KeyPoint; to_ms: number; from: EventPoints; times: ArrayLike<number> }
  /** A handle moved by whole readings (arrow keys). */
  | { type: 'step'; key: KeyPoint; steps: number; from: EventPoints; times: ArrayLike<number> }
  /** Forget hand-set key points and use the ones the core finds. */
  | { type: 'reset' }
  | { type: 'method'; kind: MethodKind }
  | { type: 'constant'; field: 'bfiMax' | 'recession'; text: string }
  | { type: 'rainfall'; text: string }
  | { type: 'note'; text: string }
  /** After a save: the note belonged to the saved analysis. */
  | { type: 'saved'; id: string }
  /** A saved analysis opened again, exactly as it was saved. */
  | { type: 'reopen'; draft: StormDraft };

/** A fresh draft. */
export const initialDraft: StormDraft = { method: defaultMethodChoice, rainfall: '', note: '' };

/** Applies one action to the draft. */
export function stormReducer(draft: StormDraft, action: StormAction): StormDraft {
  switch (action.type) {
    case 'window':
    case 'storm':
      return { ...draft, window: action.window, points: undefined, stopped: undefined, reopened: undefined };
    case 'points':
      return { ...draft, points: action.points, stopped: undefined };
    case 'move':
    case 'step': {
      const moved = action.type === 'move'
        ? movePoint(action.from, action.key, action.to_ms, action.times)
        : stepPoint(action.from, action.key, action.steps, action.times);
      return { ...draft, points: moved.points, stopped: moved.stopped };
    }
    case 'reset':
      return { ...draft, points: undefined, stopped: undefined };
    case 'method':
      return { ...draft, method: { ...draft.method, kind: action.kind } };
    case 'constant':
      return { ...draft, method: { ...draft.method, [action.field]: action.text } };
    case 'rainfall':
      return { ...draft, rainfall: action.text };
    case 'note':
      return { ...draft, note: action.text };
    case 'saved':
      return { ...draft, note: '', reopened: action.id };
    case 'reopen':
      return action.draft;
    default: {
      const unknown: never = action;
      return unknown;
    }
  }
}

/**
 * The draft that reproduces a saved analysis: its window, key points, method with its parameters and
 * rainfall (written in the site's depth unit); undefined when the saved method is not one this app knows.
 */
export function draftFromAnalysis(saved: AnalysisRecord, units: UnitSystem): StormDraft | undefined {
  const method = choiceOf(saved.method);
  if (!method) return undefined;
  return {
    window: { from_ms: saved.from_ms, to_ms: saved.to_ms },
    points: { ...saved.points },
    method,
    rainfall: saved.rainfall_mm === undefined ? '' : String(Number(toDisplay('depth', saved.rainfall_mm, units).toPrecision(12))),
    note: saved.note,
    reopened: saved.id,
  };
}
