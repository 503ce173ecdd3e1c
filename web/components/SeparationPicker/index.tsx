// The baseflow separation method picker: plain names, and the aquifer type when the Eckhardt filter is chosen.
import { useId } from 'preact/hooks';
import { BFI_MAX_PRESETS, type SeparationMethod } from '../../../core';

/** The separation methods in the order the picker lists them. */
export const METHOD_KINDS = [
  'variable-slope',
  'constant-discharge',
  'straight-line',
  'concave',
  'lyne-hollick',
  'chapman-maxwell',
  'eckhardt',
  'smoothed-minima',
  'local-minimum',
] as const satisfies readonly SeparationMethod['kind'][];

/** A separation method kind. */
export type MethodKind = (typeof METHOD_KINDS)[number];

/** An aquifer type with its Eckhardt BFImax preset. */
export type BfiPreset = keyof typeof BFI_MAX_PRESETS;

/** What the user picked: the method and, for Eckhardt, the aquifer type. */
export interface MethodChoice {
  kind: MethodKind;
  bfiPreset: BfiPreset;
}

/** The default pick: variable slope (Eckhardt would start from a perennial stream on porous rock). */
export const defaultMethodChoice: MethodChoice = { kind: 'variable-slope', bfiPreset: 'perennial-porous' };

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

const BFI_PRESETS = Object.keys(BFI_MAX_PRESETS) as BfiPreset[];

/** Plain names of the aquifer types, with their BFImax (Eckhardt 2005). */
export const BFI_PRESET_LABELS: Record<BfiPreset, string> = {
  'perennial-porous': `Perennial stream, porous rock (BFImax ${BFI_MAX_PRESETS['perennial-porous']})`,
  'ephemeral-porous': `Ephemeral stream, porous rock (BFImax ${BFI_MAX_PRESETS['ephemeral-porous']})`,
  'perennial-hard-rock': `Perennial stream, hard rock (BFImax ${BFI_MAX_PRESETS['perennial-hard-rock']})`,
};

function isMethodKind(x: string): x is MethodKind {
  return (METHOD_KINDS as readonly string[]).includes(x);
}

function isBfiPreset(x: string): x is BfiPreset {
  return (BFI_PRESETS as string[]).includes(x);
}

/** A labelled select of methods; a second select for the aquifer type appears with the Eckhardt filter. */
export function SeparationPicker({ value, onChange }: { value: MethodChoice; onChange: (next: MethodChoice) => void }) {
  const id = useId();
  return (
    <div class="separation-picker">
      <label for={`${id}-method`}>Baseflow separation</label>
      <select
        id={`${id}-method`}
        data-testid="separation-method"
        value={value.kind}
        onChange={(e) => {
          const kind = e.currentTarget.value;
          if (isMethodKind(kind)) onChange({ ...value, kind });
        }}
      >
        {METHOD_KINDS.map((k) => (
          <option key={k} value={k}>{METHOD_LABELS[k]}</option>
        ))}
      </select>
      {value.kind === 'eckhardt' && (
        <>
          <label for={`${id}-aquifer`}>Stream and aquifer type</label>
          <select
            id={`${id}-aquifer`}
            value={value.bfiPreset}
            onChange={(e) => {
              const preset = e.currentTarget.value;
              if (isBfiPreset(preset)) onChange({ ...value, bfiPreset: preset });
            }}
          >
            {BFI_PRESETS.map((p) => (
              <option key={p} value={p}>{BFI_PRESET_LABELS[p]}</option>
            ))}
          </select>
        </>
      )}
    </div>
  );
}
