// Marks a reading as a check beside the logger: the value the logger shows, typed next to the gauge
// reading, and the difference logger − gauge shown as it is typed (the logger's drift at this moment).
import { displayUnit, fromDisplay, type UnitSystem } from '../../../core';
import { formatQuantity, parseDecimal } from '../../format';
import { describedBy, Field } from '../Field';
import './style.css';

/** The logger value typed, as text; undefined when the reading is not a check. */
export type LoggerCheckText = string | undefined;

/** The typed logger value in m, or why it cannot be read; undefined when the reading is not a check or nothing is typed. */
export function loggerCheckValue(text: LoggerCheckText, units: UnitSystem): { logger_m: number } | { error: string } | undefined {
  if (text === undefined || text.trim() === '') return undefined;
  const v = parseDecimal(text);
  return v === undefined ? { error: `Type the logger’s value as a number, like ${units === 'us' ? '2.41' : '0.734'}.` } : { logger_m: fromDisplay('stage', v, units) };
}

/** The check box, the logger's value and the difference logger − gauge (stage_m is the gauge reading, m). */
export function LoggerCheck({ value, stage_m, units, error, onChange }: {
  value: LoggerCheckText;
  stage_m: number | undefined;
  units: UnitSystem;
  error?: string;
  onChange: (next: LoggerCheckText) => void;
}) {
  const parsed = loggerCheckValue(value, units);
  const shownError = error ?? (parsed && 'error' in parsed ? parsed.error : undefined);
  const diff = parsed && 'logger_m' in parsed && stage_m !== undefined ? parsed.logger_m - stage_m : undefined;
  return (
    <div class="logger-check">
      <label class="check">
        <input type="checkbox" checked={value !== undefined} onChange={(e) => onChange(e.currentTarget.checked ? '' : undefined)} />
        Check beside the logger
      </label>
      {value !== undefined && (
        <>
          <Field id="logger-value" label={`Logger shows (${displayUnit('stage', units)})`} hint="the logger’s own reading at the same time" error={shownError}>
            <input id="logger-value" type="text" inputMode="decimal" autoComplete="off" value={value}
              aria-invalid={shownError ? true : undefined} aria-describedby={describedBy('logger-value', true, !!shownError)}
              onInput={(e) => onChange(e.currentTarget.value)} />
          </Field>
          {diff !== undefined && (
            <p class="callout" data-testid="logger-difference" aria-live="polite">
              Logger − gauge: {diff >= 0 ? '+' : ''}{formatQuantity('stage', diff, units)}
            </p>
          )}
        </>
      )}
    </div>
  );
}
