// The verticals part of the gauging form: the entry of one vertical (station, depth, velocities by
// method, angle coefficient), the wading caution, and the kept verticals with correct and remove.
import { useState } from 'preact/hooks';
import { exceedsWadingLimit, fromDisplay, verticalMeanVelocity, WADING_LIMIT_M2S, type UnitSystem } from '../../../core';
import { formatQuantity, parseDecimal } from '../../format';
import { NumberField } from '../Ratings/entry';
import type { FieldError } from '../Ratings/rating-form';
import { parseVertical, type GaugingAction, type GaugingForm, type VelocityKind } from './form';

const KINDS: [VelocityKind, string][] = [['six-tenths', '0.6 depth'], ['two-point', '0.2 and 0.8'], ['three-point', '0.2, 0.6 and 0.8']];

/** Whether the vertical being typed reaches the wading limit (depth × the largest velocity typed). */
function typedWading(form: GaugingForm, units: UnitSystem): boolean {
  const d = parseDecimal(form.entry.depthText);
  const vs = [form.entry.v02Text, form.entry.v06Text, form.entry.v08Text].map(parseDecimal).filter((v): v is number => v !== undefined);
  if (d === undefined || d < 0 || vs.length === 0) return false;
  return exceedsWadingLimit(fromDisplay('length', d, units), Math.max(...vs.map((v) => Math.abs(fromDisplay('velocity', v, units)))));
}

/** Vertical entry and the list of kept verticals. */
export function Verticals({ form, dispatch, units }: { form: GaugingForm; dispatch: (a: GaugingAction) => void; units: UnitSystem }) {
  const [errors, setErrors] = useState<FieldError[]>([]);
  const lu = units === 'us' ? 'ft' : 'm';
  const vu = units === 'us' ? 'ft/s' : 'm/s';
  const e = form.entry;
  const entry = (field: 'stationText' | 'depthText' | 'v02Text' | 'v06Text' | 'v08Text' | 'angleText') => (v: string) => dispatch({ type: 'entry', field, value: v });
  const wadingKept = form.verticals.filter((v) => exceedsWadingLimit(v.depth_m, verticalMeanVelocity(v.velocity)));
  function keep() {
    const p = parseVertical(form, units);
    if (!p.ok) {
      setErrors(p.errors);
      document.getElementById(p.errors[0].field)?.focus();
      return;
    }
    setErrors([]);
    dispatch({ type: 'keepVertical', vertical: p.vertical });
    document.getElementById('vStation')?.focus();
  }
  return (
    <>
      <fieldset>
        <legend>{form.editing === undefined ? `Vertical ${form.verticals.length + 1}` : `Correcting vertical ${form.editing + 1}`}</legend>
        <div class="row two">
          <NumberField id="vStation" label={`Station (${lu})`} value={e.stationText} errors={errors} onInput={entry('stationText')} />
          <NumberField id="vDepth" label={`Depth (${lu})`} value={e.depthText} errors={errors} onInput={entry('depthText')} />
        </div>
        <button type="button" onClick={() => dispatch({ type: 'edge' })}>Edge of water (depth 0)</button>
        <label for="vKind">Velocity measured at</label>
        <select id="vKind" value={e.kind} onChange={(ev) => dispatch({ type: 'entryKind', value: ev.currentTarget.value as VelocityKind })}>
          {KINDS.map(([k, l]) => <option key={k} value={k}>{l}</option>)}
        </select>
        <div class="row two">
          {e.kind !== 'six-tenths' && <NumberField id="v02" label={`At 0.2 (${vu})`} value={e.v02Text} errors={errors} onInput={entry('v02Text')} />}
          {e.kind !== 'two-point' && <NumberField id="v06" label={`At 0.6 (${vu})`} value={e.v06Text} errors={errors} onInput={entry('v06Text')} />}
          {e.kind !== 'six-tenths' && <NumberField id="v08" label={`At 0.8 (${vu})`} value={e.v08Text} errors={errors} onInput={entry('v08Text')} />}
        </div>
        <NumberField id="vAngle" label="Angle coefficient" hint="1 when the flow is square to the section" value={e.angleText} errors={errors} onInput={entry('angleText')} />
        {typedWading(form, units) && (
          <p class="callout warn" role="alert" data-testid="wading-warning">
            Depth × velocity here reaches the wading limit (about {WADING_LIMIT_M2S.toFixed(2)} m²/s, 10 ft²/s). Do not wade: measure from a bridge, cableway or boat, or stop.
          </p>
        )}
        <div class="row">
          <button type="button" class="primary" onClick={keep}>{form.editing === undefined ? 'Keep vertical' : 'Keep the correction'}</button>
          {form.editing !== undefined && <button type="button" onClick={() => dispatch({ type: 'cancelEdit' })}>Cancel</button>}
        </div>
      </fieldset>
      {wadingKept.length > 0 && (
        <p class="callout warn">At {wadingKept.length === 1 ? 'one vertical' : `${wadingKept.length} verticals`} depth × velocity reaches the wading limit: do not wade there.</p>
      )}
      {form.verticals.length > 0 && (
        <div class="card table-scroll" tabIndex={0} aria-label="Kept verticals">
          <table class="verticals" data-testid="verticals">
            <thead><tr><th scope="col">#</th><th scope="col">Station</th><th scope="col">Depth</th><th scope="col">Velocity</th><th scope="col"><span class="sr-only">Actions</span></th></tr></thead>
            <tbody>
              {form.verticals.map((v, i) => (
                <tr key={i} aria-current={form.editing === i ? 'true' : undefined}>
                  <td>{i + 1}</td>
                  <td>{formatQuantity('length', v.station_m, units)}</td>
                  <td>{formatQuantity('length', v.depth_m, units)}</td>
                  <td>{formatQuantity('velocity', verticalMeanVelocity(v.velocity) * v.angleCoefficient, units)}</td>
                  <td>
                    <button type="button" aria-label={`Fix vertical ${i + 1}`} onClick={() => dispatch({ type: 'editVertical', index: i, units })}>Fix</button>
                    <button type="button" class="danger" aria-label={`Remove vertical ${i + 1}`} onClick={() => dispatch({ type: 'removeVertical', index: i })}>✕</button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
