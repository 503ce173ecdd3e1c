// The storm screen's draft: what the user chose for one site. Derived numbers are never kept here.
import type { EventPoints } from '../../../core';
import { defaultMethodChoice, type MethodChoice } from '../../components/SeparationPicker';

/** A time window, UTC ms, from ≤ to. */
export interface TimeWindow {
  from_ms: number;
  to_ms: number;
}

/** The user's choices for one site's storm analysis. */
export interface StormDraft {
  /** The readings window; undefined means the default (the 14 days up to the latest reading). */
  window?: TimeWindow;
  /** Key points set by the user (UTC ms); undefined means the ones the core finds. */
  points?: EventPoints;
  method: MethodChoice;
  /** Rainfall depth as typed, in the site's depth unit (mm or in). */
  rainfall: string;
  note: string;
}

/** Every change the screen can make to its draft. */
export type StormAction =
  /** A new readings window: key points set by hand no longer apply to it and are dropped. */
  | { type: 'window'; window: TimeWindow }
  /** The key points changed (typed in the fields today, dragged on the plot later): one action for both. */
  | { type: 'points'; points: EventPoints }
  /** Forget hand-set key points and use the ones the core finds. */
  | { type: 'find-again' }
  | { type: 'method'; method: MethodChoice }
  | { type: 'rainfall'; text: string }
  | { type: 'note'; text: string }
  /** After a save: the note belonged to the saved analysis. */
  | { type: 'saved' };

/** A fresh draft. */
export const initialDraft: StormDraft = { method: defaultMethodChoice, rainfall: '', note: '' };

/** Applies one action to the draft. */
export function stormReducer(draft: StormDraft, action: StormAction): StormDraft {
  switch (action.type) {
    case 'window':
      return { ...draft, window: action.window, points: undefined };
    case 'points':
      return { ...draft, points: action.points };
    case 'find-again':
      return { ...draft, points: undefined };
    case 'method':
      return { ...draft, method: action.method };
    case 'rainfall':
      return { ...draft, rainfall: action.text };
    case 'note':
      return { ...draft, note: action.text };
    case 'saved':
      return { ...draft, note: '' };
    default: {
      const unknown: never = action;
      return unknown;
    }
  }
}
