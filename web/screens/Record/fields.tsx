// The reading form's time field (following the clock, or typed in the site's zone with the question for a
// skipped or repeated wall time), its source and quality choices, and the observer and note.
import type { RefObject } from 'preact';
import { READING_QUALITIES, READING_SOURCES, toLocalInput, type ReadingQuality, type ReadingSource } from '../../../core';
import { describedBy, Field } from '../../components/Field';
import { TimeChoice } from '../../components/TimeChoice';
import type { timeOf } from './form';

const SOURCE_LABELS: Record<ReadingSource, string> = { staff: 'Staff gauge', 'wire-weight': 'Wire-weight gauge', 'crest-stage': 'Crest-stage gauge', logger: 'Logger display' };
const QUALITY_LABELS: Record<ReadingQuality, string> = { good: 'Good', fair: 'Fair', poor: 'Poor', estimated: 'Estimated' };

/** Props: the time read from the form, the typed text, the site's zone, the clock (UTC ms), the error and the callbacks. */
export interface TimeFieldProps {
  time: ReturnType<typeof timeOf>;
  timeText: string;
  timeZone: string;
  now: number;
  error?: string;
  onText: (text: string) => void;
  onChoose: (time_ms: number) => void;
}

/** The time of the reading: "now" until changed, with a Now button to go back to the clock. */
export function TimeField({ time, timeText, timeZone, now, error, onText, onChoose }: TimeFieldProps) {
  const follows = 'followsClock' in time && time.followsClock;
  return (
    <Field id="time" label={`Time (${timeZone})`} hint={follows ? 'now: follows the clock until you change it; saved at the instant of Save' : undefined} error={error}>
      <div class="row">
        <input
          id="time"
          type="datetime-local"
          value={timeText || toLocalInput(now, timeZone)}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy('time', follows, !!error)}
          onInput={(e) => onText(e.currentTarget.value)}
        />
        {!follows && <button type="button" style="flex:0 0 auto" onClick={() => onText('')}>Now</button>}
      </div>
      {'ask' in time && time.ask && (
        <TimeChoice id="time-choice" typed={timeText} answer={time.ask} timeZone={timeZone} chosen_ms={'time_ms' in time ? time.time_ms : undefined} onChoose={onChoose} />
      )}
    </Field>
  );
}

/** Props: the source and quality chosen and their callbacks. */
export interface SourceQualityProps {
  source: ReadingSource;
  quality: ReadingQuality;
  onSource: (value: ReadingSource) => void;
  onQuality: (value: ReadingQuality) => void;
}

/** "Read from" and "Quality", side by side. */
export function SourceQuality({ source, quality, onSource, onQuality }: SourceQualityProps) {
  return (
    <div class="row two">
      <Field id="source" label="Read from">
        <select id="source" value={source} onChange={(e) => onSource(e.currentTarget.value as ReadingSource)}>
          {READING_SOURCES.map((s) => <option key={s} value={s}>{SOURCE_LABELS[s]}</option>)}
        </select>
      </Field>
      <Field id="quality" label="Quality">
        <select id="quality" value={quality} onChange={(e) => onQuality(e.currentTarget.value as ReadingQuality)}>
          {READING_QUALITIES.map((q) => <option key={q} value={q}>{QUALITY_LABELS[q]}</option>)}
        </select>
      </Field>
    </div>
  );
}

/** Props: observer and note texts, whether a jump asks for a note, the note's ref and the callbacks. */
export interface ObserverNoteProps {
  observer: string;
  note: string;
  jump: boolean;
  noteRef: RefObject<HTMLTextAreaElement | null>;
  onObserver: (value: string) => void;
  onNote: (value: string) => void;
}

/** Who read the gauge, and a note (wanted when the stage jumped). */
export function ObserverNote({ observer, note, jump, noteRef, onObserver, onNote }: ObserverNoteProps) {
  return (
    <>
      <Field id="observer" label="Observer">
        <input id="observer" autoComplete="name" enterKeyHint="next" value={observer} onInput={(e) => onObserver(e.currentTarget.value)} />
      </Field>
      <div class={jump ? 'note-wanted' : undefined}>
        <Field id="note" label="Note" hint={jump ? 'say why the stage jumped, if it is right' : 'conditions: debris on the control, weed, ice, high water…'}>
          <textarea id="note" ref={noteRef} value={note} aria-describedby="note-hint" onInput={(e) => onNote(e.currentTarget.value)} />
        </Field>
      </div>
    </>
  );
}

/** The enter key moves to the next field; it never saves (Save is its own button in the bar). */
export function nextOnEnter(e: KeyboardEvent) {
  if (e.key !== 'Enter' || e.target instanceof HTMLTextAreaElement || e.target instanceof HTMLButtonElement) return;
  e.preventDefault();
  const fields = [...(e.currentTarget as HTMLFormElement).querySelectorAll<HTMLElement>('input, select, textarea')];
  fields[fields.indexOf(e.target as HTMLElement) + 1]?.focus();
}
