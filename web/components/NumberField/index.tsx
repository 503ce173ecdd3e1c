// A number typed as text (decimal keyboard) inside a labelled Field, wired for its error sentence.
import type { Ref } from 'preact';
import { describedBy, errorOf, Field, type FieldError } from '../Field';

/** Props: the control's id, label, text, the form's errors, an optional hint, and what a change does. */
export interface NumberFieldProps {
  id: string;
  label: string;
  value: string;
  errors: readonly FieldError[];
  hint?: string;
  onInput: (v: string) => void;
  /** Keys pressed in the box (e.g. Enter to move to the next box). */
  onKeyDown?: (e: KeyboardEvent) => void;
  /** What the phone's Enter key says: 'next' moves on, 'done' finishes. */
  enterKeyHint?: 'next' | 'done' | 'enter';
  inputRef?: Ref<HTMLInputElement>;
}

/** A text input with the decimal keyboard inside a Field, its error linked for screen readers. */
export function NumberField(props: NumberFieldProps) {
  const error = errorOf(props.errors, props.id);
  return (
    <Field id={props.id} label={props.label} hint={props.hint} error={error}>
      <input
        id={props.id}
        ref={props.inputRef}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        enterKeyHint={props.enterKeyHint}
        value={props.value}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(props.id, !!props.hint, !!error)}
        onInput={(e) => props.onInput(e.currentTarget.value)}
        onKeyDown={props.onKeyDown}
      />
    </Field>
  );
}
