// The stage field and what the rating and the plausibility checks say about the stage as it is typed.
import type { RefObject } from 'preact';
import { displayUnit, hasDischarge, type ReadingCheck, type UnitSystem } from '../../../core';
import { describedBy, Field } from '../../components/Field';
import { formatQuantity } from '../../format';

/** Props: the typed text, units, its error, the check of the reading (when it can be read) and the callbacks. */
export interface StageFieldProps {
  inputRef: RefObject<HTMLInputElement | null>;
  text: string;
  units: UnitSystem;
  error?: string;
  check?: ReadingCheck;
  onText: (text: string) => void;
  onAddNote: () => void;
}

/** The stage, large, with the live check under it. */
export function StageField({ inputRef, text, units, error, check, onText, onAddNote }: StageFieldProps) {
  return (
    <>
      <Field id="stage" label={`Stage (${displayUnit('stage', units)})`} error={error}>
        <input
          id="stage"
          ref={inputRef}
          class="big"
          type="text"
          inputMode="decimal"
          autoComplete="off"
          enterKeyHint="next"
          placeholder={units === 'us' ? '0.00' : '0.000'}
          value={text}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy('stage', false, !!error)}
          onInput={(e) => onText(e.currentTarget.value)}
        />
      </Field>
      {check && <LiveCheck check={check} units={units} onAddNote={onAddNote} />}
    </>
  );
}

/** Props: the check of the typed reading, units, and where "Add a note" sends the focus. */
export interface LiveCheckProps {
  check: ReadingCheck;
  units: UnitSystem;
  onAddNote: () => void;
}

/** The card under the stage field: in range or not, the shift, each warning (never blocking), the slip question. */
export function LiveCheck({ check, units, onAddNote }: LiveCheckProps) {
  return (
    <section class="live card" aria-label="Discharge details">
      {hasDischarge(check.discharge_m3s) && check.warnings.every((w) => w.code !== 'extrapolated' && w.code !== 'below-zero-flow') && (
        <p class="callout ok">Within the gauged range of the rating.</p>
      )}
      {check.shift_m !== 0 && <p class="muted">Includes a shift of {formatQuantity('stage', check.shift_m, units)}.</p>}
      {check.slip && <p class="callout warn" data-warning="slip">{check.slip}</p>}
      {check.warnings.map((w) => (
        <p key={w.code} class="callout warn" data-warning={w.code}>
          {w.text}
          {w.code === 'jump' && <> <button type="button" onClick={onAddNote}>Add a note</button></>}
        </p>
      ))}
      {check.warnings.length > 0 && <p class="hint">Warnings do not stop saving; they are stored with the reading.</p>}
    </section>
  );
}
