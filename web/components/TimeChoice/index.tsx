// Asks which instant a typed time means when the site's clocks skipped it (spring forward) or showed it
// twice (autumn back). The answer from core/time is never shifted silently: the user picks one.
import { toIsoWithOffset, toLocalInput, type WallTimeAnswer } from '../../../core';

/** Props: the ambiguous answer, the zone, the instant chosen so far (UTC ms) and the pick callback. */
export interface TimeChoiceProps {
  id: string;
  typed: string;
  answer: Extract<WallTimeAnswer, { kind: 'gap' | 'repeated' }>;
  timeZone: string;
  chosen_ms?: number;
  onChoose: (time_ms: number) => void;
}

const offsetOf = (t: number, zone: string): string => `UTC${toIsoWithOffset(t, zone).slice(19)}`;
const clockOf = (t: number, zone: string): string => toLocalInput(t, zone).slice(11);

/** Two labelled choices with a question saying why they are needed. */
export function TimeChoice({ id, typed, answer, timeZone, chosen_ms, onChoose }: TimeChoiceProps) {
  const [a, b] = answer.candidates_ms;
  const shown = typed.replace('T', ' ');
  const question =
    answer.kind === 'repeated'
      ? `${shown} happened twice in ${timeZone}: the clocks went back an hour. Which one was it?`
      : `${shown} did not happen in ${timeZone}: the clocks went forward at that hour. Which time was it?`;
  const labels =
    answer.kind === 'repeated'
      ? [`The first ${clockOf(a, timeZone)} (${offsetOf(a, timeZone)}), before the clocks went back`, `The second ${clockOf(b, timeZone)} (${offsetOf(b, timeZone)}), after the clocks went back`]
      : [`${clockOf(a, timeZone)} (${offsetOf(a, timeZone)}), the hour before the change`, `${clockOf(b, timeZone)} (${offsetOf(b, timeZone)}), if the watch was not yet put forward`];
  return (
    <fieldset class="time-choice callout warn" id={id} data-testid="time-choice">
      <legend>{question}</legend>
      {[a, b].map((t, i) => (
        <label class="choice" key={t}>
          <input type="radio" name={`${id}-pick`} value={String(i)} checked={chosen_ms === t} onChange={() => onChoose(t)} /> {labels[i]}
        </label>
      ))}
    </fieldset>
  );
}
