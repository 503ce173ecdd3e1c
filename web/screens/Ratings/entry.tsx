// Entering a rating by hand: valid from (site's zone), segments, gauged range, note. While typing, the
// discharge at a few stages and the continuity check at each breakpoint (a jump is shown, not refused).
import { useMemo, useReducer, useState } from 'preact/hooks';
import { dischargeAt, ratingContinuity, RecordValidationError, type SiteRecord } from '../../../core';
import { saveRating, StorageError } from '../../db';
import { describedBy, errorOf, Field, type FieldError } from '../../components/Field';
import { NumberField } from '../../components/NumberField';
import { formatQuantity } from '../../format';
import { href, navigate } from '../../router';
import { unitLabels } from './describe';
import { blankRatingForm, blankSegment, parseRatingForm, previewStages, type RatingForm, type SegmentText } from './rating-form';
import { plainError } from '../../plain-words';

type Action =
  | { type: 'set'; field: 'validFromText' | 'rangeLowText' | 'rangeHighText' | 'note'; value: string }
  | { type: 'segment'; index: number; field: keyof SegmentText; value: string }
  | { type: 'addSegment' }
  | { type: 'removeSegment'; index: number };

function reducer(form: RatingForm, a: Action): RatingForm {
  switch (a.type) {
    case 'set':
      return { ...form, [a.field]: a.value };
    case 'segment':
      return { ...form, segments: form.segments.map((s, i) => (i === a.index ? { ...s, [a.field]: a.value } : s)) };
    case 'addSegment':
      return { ...form, segments: [...form.segments, blankSegment()] };
    case 'removeSegment':
      return { ...form, segments: form.segments.filter((_, i) => i !== a.index) };
  }
}

/** The hand-entry form of a rating for one site. */
export function RatingEntry({ site }: { site: SiteRecord }) {
  const u = site.displayUnits;
  const { su, qu } = unitLabels(u);
  const [form, dispatch] = useReducer(reducer, undefined, () => blankRatingForm(Date.now(), site.timeZone));
  const [shown, setShown] = useState<FieldError[]>([]);
  const [failure, setFailure] = useState<string>();
  const [saving, setSaving] = useState(false);
  const parsed = useMemo(() => parseRatingForm(form, { units: u, timeZone: site.timeZone, now_ms: Date.now() }), [form, u, site.timeZone]);
  const preview = useMemo(() => {
    if (!parsed.ok) return undefined;
    const rating = { segments: parsed.segments, gaugedRange_m: parsed.gaugedRange_m };
    return { rows: previewStages(parsed.segments, parsed.gaugedRange_m).map((h) => ({ h, q: dischargeAt(rating, h) })), continuity: ratingContinuity(rating) };
  }, [parsed]);

  async function onSave(e: Event) {
    e.preventDefault();
    setFailure(undefined);
    if (!parsed.ok) {
      setShown(parsed.errors);
      document.getElementById(parsed.errors[0].field)?.focus();
      return;
    }
    setShown([]);
    setSaving(true);
    try {
      const saved = await saveRating({
        siteId: site.id, validFrom_ms: parsed.validFrom_ms, segments: parsed.segments, ...(parsed.gaugedRange_m && { gaugedRange_m: parsed.gaugedRange_m }),
        shifts: [], fittedFrom: [], note: parsed.note,
      });
      navigate(href('sites', site.id, 'ratings', saved.id), true);
    } catch (err) {
      setFailure(`Not saved: ${plainError(err, { doing: 'save' })}`);
    } finally {
      setSaving(false);
    }
  }

  const errors = shown;
  return (
    <form onSubmit={onSave} noValidate>
      <h2 id="screen-title" tabIndex={-1}>New rating by hand</h2>
      <p class="muted">{site.name} · Q = C·(h − e)^b for each segment, h and e in {su}, Q in {qu}.</p>
      <Field id="validFrom" label={`Applies from (${site.timeZone})`} error={errorOf(errors, 'validFrom')}>
        <input id="validFrom" type="datetime-local" value={form.validFromText} aria-invalid={errorOf(errors, 'validFrom') ? true : undefined}
          aria-describedby={describedBy('validFrom', false, !!errorOf(errors, 'validFrom'))}
          onInput={(e) => dispatch({ type: 'set', field: 'validFromText', value: e.currentTarget.value })} />
      </Field>
      {form.segments.map((s, i) => (
        <fieldset key={i} class="segment-card">
          <legend>Segment {i + 1}</legend>
          <div class="row two">
            <NumberField id={`seg${i}-from`} label={`Starts at (${su})`} hint={i === 0 ? 'blank: from its offset' : undefined} value={s.fromText} errors={errors}
              onInput={(v) => dispatch({ type: 'segment', index: i, field: 'fromText', value: v })} />
            <NumberField id={`seg${i}-offset`} label={`Offset e (${su})`} hint="stage of zero flow" value={s.offsetText} errors={errors}
              onInput={(v) => dispatch({ type: 'segment', index: i, field: 'offsetText', value: v })} />
          </div>
          <div class="row two">
            <NumberField id={`seg${i}-coefficient`} label="Coefficient C" value={s.coefficientText} errors={errors}
              onInput={(v) => dispatch({ type: 'segment', index: i, field: 'coefficientText', value: v })} />
            <NumberField id={`seg${i}-exponent`} label="Exponent b" value={s.exponentText} errors={errors}
              onInput={(v) => dispatch({ type: 'segment', index: i, field: 'exponentText', value: v })} />
          </div>
          {form.segments.length > 1 && <button type="button" class="danger" onClick={() => dispatch({ type: 'removeSegment', index: i })}>Remove segment {i + 1}</button>}
        </fieldset>
      ))}
      <button type="button" class="wide" onClick={() => dispatch({ type: 'addSegment' })}>Add a segment above</button>
      <div class="row two">
        <NumberField id="rangeLow" label={`Lowest gauged (${su})`} value={form.rangeLowText} errors={errors} onInput={(v) => dispatch({ type: 'set', field: 'rangeLowText', value: v })} />
        <NumberField id="rangeHigh" label={`Highest gauged (${su})`} value={form.rangeHighText} errors={errors} onInput={(v) => dispatch({ type: 'set', field: 'rangeHighText', value: v })} />
      </div>
      <Field id="ratingNote" label="Note">
        <textarea id="ratingNote" value={form.note} onInput={(e) => dispatch({ type: 'set', field: 'note', value: e.currentTarget.value })} />
      </Field>
      <section class="card" aria-live="polite" aria-label="Discharge while typing">
        {!preview && <p class="muted">The discharge at a few stages appears here once each segment has its four numbers.</p>}
        {preview && (
          <>
            <table class="preview" data-testid="preview">
              <thead><tr><th scope="col">Stage</th><th scope="col">Discharge</th></tr></thead>
              <tbody>
                {preview.rows.map((r) => (
                  <tr key={r.h}><td>{formatQuantity('stage', r.h, u)}</td><td>{formatQuantity('discharge', r.q, u)}</td></tr>
                ))}
              </tbody>
            </table>
            {preview.continuity.breakpoints.map((b) => (
              <p key={b.stage_m} class={Math.abs(b.jump_pct) > 1 ? 'callout warn' : 'muted'} data-testid="continuity">
                At {formatQuantity('stage', b.stage_m, u)}: {formatQuantity('discharge', b.below_m3s, u)} below, {formatQuantity('discharge', b.above_m3s, u)} above
                {Number.isFinite(b.jump_pct) ? ` (${b.jump_pct > 0 ? '+' : ''}${b.jump_pct.toFixed(1)} %)` : ' (the segment below gives no flow there)'}
                {Math.abs(b.jump_pct) > 1 ? ': a jump of more than 1 %. It can be saved; check the numbers.' : '.'}
              </p>
            ))}
          </>
        )}
      </section>
      {errors.length > 0 && <p class="callout bad" role="alert">Not saved: {errors.length} field{errors.length > 1 ? 's need' : ' needs'} correcting (marked above).</p>}
      {failure && <p class="callout bad" role="alert">{failure}</p>}
      <button type="submit" class="primary wide" disabled={saving}>{saving ? 'Saving…' : 'Save rating'}</button>
    </form>
  );
}
