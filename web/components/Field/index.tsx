// A labelled form field with an optional hint and an error that names what is wrong.
import type { ComponentChildren } from 'preact';
import './style.css';

export { errorOf, type FieldError } from './field-error';

/** Props: a unique id for the control, the label, a hint, an error sentence, and the control itself. */
export interface FieldProps {
  id: string;
  label: string;
  hint?: string;
  error?: string;
  children: ComponentChildren;
}

/** Label above, control, hint and error below; the control must carry `id` and aria-describedby from `describedBy(id)`. */
export function Field({ id, label, hint, error, children }: FieldProps) {
  return (
    <div class="field">
      <label for={id}>
        {label}
        {hint && <span class="hint" id={`${id}-hint`}>{hint}</span>}
      </label>
      {children}
      {error && (
        <p class="callout bad" id={`${id}-error`} role="alert">
          {error}
        </p>
      )}
    </div>
  );
}

/** The aria-describedby value for a control of Field `id`. */
export function describedBy(id: string, hint: boolean, error: boolean): string | undefined {
  const ids = [hint && `${id}-hint`, error && `${id}-error`].filter(Boolean);
  return ids.length ? ids.join(' ') : undefined;
}
