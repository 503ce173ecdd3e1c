// The verticals part of the gauging form: the entry of one vertical (station with the next one offered
// from the last spacing, depth, velocities by method, angle coefficient), Enter moving from box to box
// and keeping the vertical from the last, the wading caution, and the kept verticals (Fix opens one to
// correct or remove).
import { useState } from 'preact/hooks';
import { exceedsWadingLimit, fromDisplay, verticalMeanVelocity, WADING_LIMIT_M2S, type MidSectionResult, type UnitSystem } from '../../../core';
import type { FieldError } from '../../components/Field';
import { NumberField } from '../../components/NumberField';
import { parseDecimal } from '../../format';
import { enterOrder, offeredStation, VELOCITY_KINDS, type GaugingAction, type GaugingForm } from './form';
import { parseVertical } from './read-vertical';
import { VerticalTable } from './vertical-table';

/** Whether the vertical being typed reaches the wading limit (depth × the largest velocity typed). */
function typedWading(form: GaugingForm, units: UnitSystem): boolean {
  const d = parseDecimal(form.entry.depthText);
  const vs = [form.entry.v02Text, form.entry.v06Text, form.entry.v08Text].map(parseDecimal).filter((v): v is number => v !== undefined);
  if (d === undefined || d < 0 || vs.length === 0) return false;
  return exceedsWadingLimit(fromDisplay('length', d, units), Math.max(...vs.map((v) => Math.abs(fromDisplay('velocity', v, units)))));
}

const focus = (id: string) => document.getElementById(id)?.focus();

/** Vertical entry and the list of kept verticals. */
export function Verticals({ form, dispatch, units, totals }: { form: GaugingForm; dispatch: (a: GaugingAction) => void; units: UnitSystem; totals: MidSectionResult | undefined }) {
  const [errors, setErrors] = useState<FieldError[]>([]);
  const lu = units === 'us' ? 'ft' : 'm';
  const vu = units === 'us' ? 'ft/s' : 'm/s';
  const e = form.entry;
  const entry = (field: 'stationText' | 'depthText' | 'v02Text' | 'v06Text' | 'v08Text' | 'angleText') => (v: string) => dispatch({ type: 'entry', field, value: v });
  const wadingKept = form.verticals.filter((v) => exceedsWadingLimit(v.depth_m, verticalMeanVelocity(v.velocity)));
  const offer = offeredStation(form, units);
  const carriedFrom = form.editing === undefined && form.verticals.length > 0 ? form.verticals.length : undefined;

  function keep(current: GaugingForm) {
    const p = parseVertical(current, units);
    if (!p.ok) {
      setErrors(p.errors);
      focus(p.errors[0].field);
      return;
    }
    setErrors([]);
    dispatch({ type: 'keepVertical', vertical: p.vertical });
    // The totals and the next vertical's boxes come into view together; the station box takes the keys.
    document.getElementById('running-totals')?.scrollIntoView({ block: 'start' });
    document.getElementById('vStation')?.focus({ preventScroll: true });
  }
  function acceptOffer() {
    if (offer === undefined) return;
    dispatch({ type: 'entry', field: 'stationText', value: offer });
    focus('vDepth');
  }
  // Enter moves to the next box (an empty station box takes the offered station); on the last it keeps
  // the vertical. It never submits the whole gauging.
  function onEnter(id: string) {
    return (ev: KeyboardEvent) => {
      if (ev.key !== 'Enter') return;
      ev.preventDefault();
      if (id === 'vStation' && e.stationText.trim() === '' && offer !== undefined) return acceptOffer();
      const order = enterOrder(e.kind);
      const next = order[order.indexOf(id) + 1];
      if (next) focus(next);
      else keep(form);
    };
  }
  const velocityField = (id: 'v02' | 'v06' | 'v08', at: string, field: 'v02Text' | 'v06Text' | 'v08Text') => {
    const last = enterOrder(e.kind).at(-1) === id;
    return <NumberField id={id} label={`At ${at} (${vu})`} value={e[field]} errors={errors} onInput={entry(field)} onKeyDown={onEnter(id)} enterKeyHint={last ? 'done' : 'next'} />;
  };
  return (
    <>
      <fieldset class="vertical-entry">
        <legend>{form.editing === undefined ? `Vertical ${form.verticals.length + 1}` : `Correcting vertical ${form.editing + 1}`}</legend>
        <div class="station-row">
          <NumberField id="vStation" label={`Station (${lu})`} value={e.stationText} errors={errors} onInput={entry('stationText')} onKeyDown={onEnter('vStation')} enterKeyHint="next" />
          <NumberField id="vDepth" label={`Depth (${lu})`} value={e.depthText} errors={errors} onInput={entry('depthText')} onKeyDown={onEnter('vDepth')} enterKeyHint="next" />
        </div>
        <div class="row">
          {offer !== undefined && e.stationText.trim() === '' && (
            <button type="button" class="offer" data-testid="offered-station" onClick={acceptOffer}>Station {offer} {lu}</button>
          )}
          <button type="button" onClick={() => dispatch({ type: 'edge' })}>Edge of water</button>
        </div>
        <p class="label" id="vKind-label">Velocity at{carriedFrom !== undefined && <span class="hint" data-testid="carried">carried over from vertical {carriedFrom}: tap to change</span>}</p>
        <div class="carried" role="group" aria-labelledby="vKind-label">
          {VELOCITY_KINDS.map(([k, l]) => (
            <button key={k} type="button" aria-pressed={e.kind === k} onClick={() => dispatch({ type: 'entryKind', value: k })}>{l}</button>
          ))}
        </div>
        <div class="row two">
          {e.kind !== 'six-tenths' && velocityField('v02', '0.2', 'v02Text')}
          {e.kind !== 'two-point' && velocityField('v06', '0.6', 'v06Text')}
          {e.kind !== 'six-tenths' && velocityField('v08', '0.8', 'v08Text')}
        </div>
        <div class="station-row">
          <NumberField id="vAngle" label="Angle coefficient"
            hint={carriedFrom !== undefined ? `carried over from vertical ${carriedFrom}` : '1 when the flow is square to the section'}
            value={e.angleText} errors={errors} onInput={entry('angleText')} />
          {e.angleText.trim() !== '1' && <button type="button" onClick={() => dispatch({ type: 'entry', field: 'angleText', value: '1' })}>Square (1)</button>}
        </div>
        {typedWading(form, units) && (
          <p class="callout warn" role="alert" data-testid="wading-warning">
            Depth × velocity here reaches the wading limit (about {WADING_LIMIT_M2S.toFixed(2)} m²/s, 10 ft²/s). Do not wade: measure from a bridge, cableway or boat, or stop.
          </p>
        )}
        <div class="row">
          <button type="button" class="primary" onClick={() => keep(form)}>{form.editing === undefined ? 'Keep vertical' : 'Keep the correction'}</button>
          {form.editing !== undefined && (
            <>
              <button type="button" class="danger" onClick={() => form.editing !== undefined && dispatch({ type: 'removeVertical', index: form.editing })}>Remove it</button>
              <button type="button" onClick={() => dispatch({ type: 'cancelEdit' })}>Cancel</button>
            </>
          )}
        </div>
      </fieldset>
      {wadingKept.length > 0 && (
        <p class="callout warn">At {wadingKept.length === 1 ? 'one vertical' : `${wadingKept.length} verticals`} depth × velocity reaches the wading limit: do not wade there.</p>
      )}
      {form.verticals.length > 0 && (
        <VerticalTable
          label="Kept verticals"
          rows={form.verticals.map((v) => ({ station_m: v.station_m, depth_m: v.depth_m, velocity_mps: verticalMeanVelocity(v.velocity) * v.angleCoefficient }))}
          totals={totals}
          units={units}
          current={form.editing}
          actions={(i) => (
            <>
              <button type="button" aria-label={`Fix vertical ${i + 1}`} onClick={() => { dispatch({ type: 'editVertical', index: i, units }); focus('vStation'); }}>Fix</button>
            </>
          )}
        />
      )}
    </>
  );
}
