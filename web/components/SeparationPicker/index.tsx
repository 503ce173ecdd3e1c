// The separation method chooser: the core's methods grouped by how they work, with our labels and titles,
// and for the Eckhardt filter its two constants as numbers to type, the published values as suggestions.
import { useId } from 'preact/hooks';
import {
  BFI_MAX_PRESETS,
  defaultEckhardt,
  SEPARATION_FAMILY,
  SEPARATION_FAMILY_SENTENCES,
  SEPARATION_METHOD_KINDS,
  type SeparationFamily,
  type SeparationMethodKind,
} from '../../../core';
import './style.css';

/** The separation methods in the order they are listed (the core's list). */
export const METHOD_KINDS = SEPARATION_METHOD_KINDS;

/** A separation method kind. */
export type MethodKind = SeparationMethodKind;

/** What the user chose: the method and, for Eckhardt, BFImax and the recession constant as typed. */
export interface MethodChoice {
  kind: MethodKind;
  bfiMax: string;
  recession: string;
}

/** Plain names of the methods. */
export const METHOD_LABELS: Record<MethodKind, string> = {
  'variable-slope': 'Variable slope',
  'constant-discharge': 'Constant discharge',
  'straight-line': 'Straight line',
  concave: 'Concave',
  'lyne-hollick': 'Lyne–Hollick filter',
  'chapman-maxwell': 'Chapman–Maxwell filter',
  eckhardt: 'Eckhardt filter',
  'smoothed-minima': 'Smoothed minima',
  'local-minimum': 'Local minimum',
};

/** Our titles for the core's method families; the families, their members and sentences live in core. */
const FAMILY_TITLES: Record<SeparationFamily, string> = {
  'key-points': 'Drawn under the storm',
  'recursive-filter': 'Filtered out of the record',
  minima: 'Joined from the low points',
};

const FAMILIES = Object.keys(FAMILY_TITLES) as SeparationFamily[];

/** Published typical BFImax values (Eckhardt 2005, Table 1), offered as suggestions, never as a menu. */
const BFI_SUGGESTIONS: { value: number; where: string }[] = [
  { value: BFI_MAX_PRESETS['perennial-porous'], where: 'perennial streams on porous aquifers' },
  { value: BFI_MAX_PRESETS['ephemeral-porous'], where: 'ephemeral streams on porous aquifers' },
  { value: BFI_MAX_PRESETS['perennial-hard-rock'], where: 'perennial streams on hard-rock aquifers' },
];

/** Props: the choice, a callback per change, and the sentence saying why a typed constant cannot be read. */
export interface SeparationPickerProps {
  value: MethodChoice;
  onKind: (kind: MethodKind) => void;
  onConstant: (field: 'bfiMax' | 'recession', text: string) => void;
  problem?: string;
}

/** Radio buttons in three groups; the Eckhardt constants appear under the Eckhardt filter when it is chosen. */
export function SeparationPicker({ value, onKind, onConstant, problem }: SeparationPickerProps) {
  const id = useId();
  return (
    <div class="separation-picker">
      {FAMILIES.map((family) => (
        <fieldset key={family} class="method-group">
          <legend>{FAMILY_TITLES[family]}</legend>
          <p class="hint">{SEPARATION_FAMILY_SENTENCES[family]}</p>
          {METHOD_KINDS.filter((k) => SEPARATION_FAMILY[k] === family).map((k) => (
            <label key={k} class="choice">
              <input type="radio" name={`${id}-method`} value={k} checked={value.kind === k} onChange={() => onKind(k)} data-method={k} />
              {METHOD_LABELS[k]}
            </label>
          ))}
          {family === SEPARATION_FAMILY.eckhardt && value.kind === 'eckhardt' && (
            <div class="eckhardt-constants">
              <label for={`${id}-bfi`}>Largest baseflow index (BFImax), 0–1</label>
              <input id={`${id}-bfi`} inputMode="decimal" autocomplete="off" value={value.bfiMax} aria-describedby={`${id}-bfi-hint`} onInput={(e) => onConstant('bfiMax', e.currentTarget.value)} />
              <p class="hint" id={`${id}-bfi-hint`}>Typical values published by Eckhardt (2005):</p>
              <div class="suggestions">
                {BFI_SUGGESTIONS.map((s) => (
                  <button key={s.value} type="button" class="suggestion" onClick={() => onConstant('bfiMax', String(s.value))}>
                    {s.value.toFixed(2)} <span class="hint">{s.where}</span>
                  </button>
                ))}
              </div>
              <label for={`${id}-rec`}>Recession constant, per day, 0–1</label>
              <input id={`${id}-rec`} inputMode="decimal" autocomplete="off" value={value.recession} aria-describedby={`${id}-rec-hint`} onInput={(e) => onConstant('recession', e.currentTarget.value)} />
              <p class="hint" id={`${id}-rec-hint`}>
                The value Eckhardt (2005) used for daily flows is {defaultEckhardt.recession}; a recession fitted on this stream is better.
              </p>
              <button type="button" class="suggestion" onClick={() => onConstant('recession', String(defaultEckhardt.recession))}>
                {defaultEckhardt.recession} <span class="hint">Eckhardt (2005), daily flows</span>
              </button>
              {problem && <p class="callout warn" role="alert">{problem}</p>}
            </div>
          )}
        </fieldset>
      ))}
    </div>
  );
}
