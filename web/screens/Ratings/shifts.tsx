// A rating's dated shifts: the list (with remove) and the form to add a constant, stage-variable or
// prorated shift, showing the discharge at the site's last stage before and after.
import { Fragment } from 'preact';
import { useMemo, useState } from 'preact/hooks';
import { dischargeAtTime, toLocalInput, type DatedShift, type RatingRecord, type SiteRecord } from '../../../core';
import { latestReading, saveRating } from '../../db';
import { useRecords } from '../../components/use-records';
import { describedBy, errorOf, Field, type FieldError } from '../../components/Field';
import { formatQuantity, formatTime } from '../../format';
import { blankShiftForm, mergeShifts, parseShiftForm, type ShiftForm, type ShiftKind } from './shift-form';
import { plainError } from '../../plain-words';

/** A shift in words, in parts that never break inside ("0.120 m", "−0.020 m at 0.300 m"). */
function shiftWords(s: DatedShift, u: SiteRecord['displayUnits']): string[] {
  const pts = s.curve.points;
  const what = pts.length === 1 ? [formatQuantity('stage', pts[0].shift_m, u)] : pts.map((p) => `${formatQuantity('stage', p.shift_m, u)} at ${formatQuantity('stage', p.stage_m, u)}`);
  return s.toNext === 'prorate' ? [...what, 'moving in time to the next'] : what;
}

/** The discharge (m³/s) of a rating, given this list of shifts, at a stage (m) and time (UTC ms) it covers. */
function dischargeWith(rating: RatingRecord, shifts: readonly DatedShift[], stage_m: number, time_ms: number): number {
  return dischargeAtTime([{ ...rating, shifts }], time_ms, stage_m).discharge_m3s;
}

/** Shifts of one rating. */
export function Shifts({ site, rating }: { site: SiteRecord; rating: RatingRecord }) {
  const u = site.displayUnits;
  const su = u === 'us' ? 'ft' : 'm';
  const last = useRecords(() => latestReading(site.id), ['reading'], [site.id]);
  const [form, setForm] = useState<ShiftForm>(() => blankShiftForm(toLocalInput(Date.now(), site.timeZone)));
  const [errors, setErrors] = useState<FieldError[]>([]);
  const [message, setMessage] = useState<string>();
  const parsed = useMemo(() => parseShiftForm(form, { units: u, timeZone: site.timeZone, validFrom_ms: rating.validFrom_ms }), [form, u, site.timeZone, rating.validFrom_ms]);
  const reading = last.state === 'ready' ? last.value : undefined;
  const effect = useMemo(() => {
    if (!reading || reading.time_ms < rating.validFrom_ms || !parsed.ok) return undefined;
    const after = mergeShifts(rating.shifts, parsed.added);
    return { before: dischargeWith(rating, rating.shifts, reading.stage_m, reading.time_ms), after: dischargeWith(rating, after, reading.stage_m, reading.time_ms) };
  }, [reading, parsed, rating]);
  const set = (patch: Partial<ShiftForm>) => setForm({ ...form, ...patch });

  async function add(e: Event) {
    e.preventDefault();
    setMessage(undefined);
    if (!parsed.ok) {
      setErrors(parsed.errors);
      return;
    }
    setErrors([]);
    try {
      await saveRating({ ...rating, shifts: mergeShifts(rating.shifts, parsed.added) });
      setMessage('Shift saved: discharges of readings in its period follow it at once.');
      setForm(blankShiftForm(form.fromText));
    } catch (err) {
      setMessage(`Not saved: ${plainError(err, { doing: 'save' })}`);
    }
  }
  async function remove(i: number) {
    await saveRating({ ...rating, shifts: rating.shifts.filter((_, k) => k !== i) });
  }
  const text = (id: string, label: string, key: 'shiftText' | 'endShiftText', hint?: string) => (
    <Field id={id} label={label} hint={hint} error={errorOf(errors, id)}>
      <input id={id} type="text" inputMode="decimal" value={form[key]} aria-invalid={errorOf(errors, id) ? true : undefined}
        aria-describedby={describedBy(id, !!hint, !!errorOf(errors, id))} onInput={(e) => set({ [key]: e.currentTarget.value })} />
    </Field>
  );
  const time = (id: string, label: string, key: 'fromText' | 'toText') => (
    <Field id={id} label={label} error={errorOf(errors, id)}>
      <input id={id} type="datetime-local" value={form[key]} aria-invalid={errorOf(errors, id) ? true : undefined}
        aria-describedby={describedBy(id, false, !!errorOf(errors, id))} onInput={(e) => set({ [key]: e.currentTarget.value })} />
    </Field>
  );
  const kinds: [ShiftKind, string][] = [['constant', 'Constant'], ['stage-variable', 'Varies with stage'], ['prorated', 'Prorated between two dates']];
  return (
    <section aria-labelledby="shifts-heading">
      <h3 id="shifts-heading">Shifts</h3>
      {rating.shifts.length === 0 ? <p class="muted">No shifts: the rating applies as it is.</p> : (
        <ul class="list card" aria-label="Dated shifts">
          {rating.shifts.map((s, i) => (
            <li key={s.time_ms} class="item">
              <span>From <span class="nowrap">{formatTime(s.time_ms, site.timeZone)}</span>
                <span class="hint" data-testid="shift-words">{shiftWords(s, u).map((w, k, all) => (
                  // The comma stays with the value before it, so a line never starts with one.
                  <Fragment key={k}><span class="nowrap">{w}{k < all.length - 1 && ','}</span>{k < all.length - 1 && ' '}</Fragment>
                ))}</span>
              </span>
              <button type="button" class="danger" aria-label={`Remove the shift from ${formatTime(s.time_ms, site.timeZone)}`} onClick={() => void remove(i)}>Remove</button>
            </li>
          ))}
        </ul>
      )}
      <form class="card" onSubmit={add} noValidate>
        <Field id="shiftKind" label="Add a shift">
          <select id="shiftKind" value={form.kind} onChange={(e) => set({ kind: e.currentTarget.value as ShiftKind })}>
            {kinds.map(([k, l]) => <option key={k} value={k}>{l}</option>)}
          </select>
        </Field>
        {time('shiftFrom', `From (${site.timeZone})`, 'fromText')}
        {form.kind === 'constant' && text('shiftValue', `Shift (${su})`, 'shiftText', 'added to the stage: + for scour, − for fill or weed')}
        {form.kind === 'stage-variable' && (
          <Field id="shiftPoints" label={`Stage and shift (${su}), one pair a line`} hint="linear between the lines, constant beyond them" error={errorOf(errors, 'shiftPoints')}>
            <textarea id="shiftPoints" value={form.pointsText} placeholder={'0.30 -0.02\n0.80 0.00'} aria-invalid={errorOf(errors, 'shiftPoints') ? true : undefined}
              aria-describedby={describedBy('shiftPoints', true, !!errorOf(errors, 'shiftPoints'))} onInput={(e) => set({ pointsText: e.currentTarget.value })} />
          </Field>
        )}
        {form.kind === 'prorated' && (
          <>
            {text('shiftValue', `Shift at the start (${su})`, 'shiftText')}
            {time('shiftTo', `Until (${site.timeZone})`, 'toText')}
            {text('shiftEnd', `Shift reached at the end (${su})`, 'endShiftText')}
          </>
        )}
        <p data-testid="shift-effect" aria-live="polite">
          {!reading ? 'No reading at this site yet to show the effect on.' : reading.time_ms < rating.validFrom_ms ? 'The last reading is before this rating applies.' : effect
            ? `Last stage ${formatQuantity('stage', reading.stage_m, u)} (${formatTime(reading.time_ms, site.timeZone)}): ${formatQuantity('discharge', effect.before, u)} now, ${formatQuantity('discharge', effect.after, u)} with this shift.`
            : `Last stage ${formatQuantity('stage', reading.stage_m, u)}: the discharge with the shift shows once the shift is complete.`}
        </p>
        {message && <p class={message.startsWith('Not') ? 'callout bad' : 'callout ok'} role="status">{message}</p>}
        <button type="submit" class="primary wide">Add shift</button>
      </form>
    </section>
  );
}
