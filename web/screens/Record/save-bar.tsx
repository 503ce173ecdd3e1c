// The bar at the bottom of the reading form: what was saved (with undo), a question or error, the live
// discharge and Save, in thumb reach.
import { hasDischarge, type ReadingCheck, type UnitSystem } from '../../../core';
import { formatQuantity } from '../../format';

/** An error or a question shown in the bar; a question has a button that answers it. */
export interface BarMessage {
  text: string;
  /** The answer button's label and what it does (e.g. "Keep this time"). */
  answer?: { label: string; onAnswer: () => void };
}

/** Props: the saved line and its undo, the message, the check for the discharge, units, saving and editing states. */
export interface SaveBarProps {
  saved?: { text: string; id?: string };
  onUndo: (id: string) => void;
  message?: BarMessage;
  check?: ReadingCheck;
  units: UnitSystem;
  saving: boolean;
  editing: boolean;
}

/** The save bar. */
export function SaveBar({ saved, onUndo, message, check, units, saving, editing }: SaveBarProps) {
  const discharge = !check ? 'Discharge: type the stage' : !hasDischarge(check.discharge_m3s) ? 'No discharge' : formatQuantity('discharge', check.discharge_m3s, units);
  return (
    <div class="savebar" data-testid="savebar">
      <div aria-live="polite">
        {saved && (
          <p class="callout ok" role="status" data-testid="saved">
            {saved.text}
            {saved.id && <> <button type="button" onClick={() => onUndo(saved.id!)}>Undo</button></>}
          </p>
        )}
        {message && (
          <p class="callout bad" role="alert" data-testid="bar-message">
            {message.text}
            {message.answer && <> <button type="button" onClick={message.answer.onAnswer}>{message.answer.label}</button></>}
          </p>
        )}
      </div>
      <div class="row">
        <p class="figure" aria-live="polite" aria-label="Discharge">
          <span data-testid="discharge">{discharge}</span>
          {check?.extrapolated && <> <span class="tag">extrapolated</span></>}
        </p>
        <button type="submit" class="primary save" disabled={saving}>{saving ? 'Saving…' : editing ? 'Save changes' : 'Save reading'}</button>
      </div>
    </div>
  );
}
