// Entering a gauging: a summary, or vertical by vertical (mid-section, ISO 748) with running totals,
// the largest subsection share, the count of verticals and the wading caution. The form is kept as a
// draft on every change and restored when the app reopens; saving shows the deviation from the rating.
import { useEffect, useMemo, useReducer, useState } from 'preact/hooks';
import {
  GAUGING_GRADES, GAUGING_METHODS, MAX_SUBSECTION_SHARE, MIN_VERTICALS, toLocalInput,
  type GaugingMethod, type MeasurementGrade, type SiteRecord,
} from '../../../core';
import { ratingsAndGaugings, saveGauging } from '../../db';
import { restorableDrafts, useKeptDraft } from '../../app/use-kept-draft';
import { plainError } from '../../plain-words';
import { Cautions } from '../../components/Cautions';
import { describedBy, Field } from '../../components/Field';
import { formatQuantity, formatTime } from '../../format';
import { href } from '../../router';
import { errorOf, NumberField } from '../Ratings/entry';
import type { FieldError } from '../Ratings/rating-form';
import { formatArea_m2 } from '../Ratings/units';
import { gaugingCheck } from './check';
import { Verticals } from './verticals';
import { blankGaugingForm, fromDraftFields, gaugingReducer, hasContent, parseGaugingForm, runningTotals, toDraftFields } from './form';

const METHOD_LABELS: Record<GaugingMethod, string> = {
  'velocity-area': 'Current meter (velocity–area)', 'acoustic-profiler': 'Acoustic profiler', volumetric: 'Volumetric', dilution: 'Dilution', float: 'Floats', other: 'Other',
};
const GRADE_LABELS: Record<MeasurementGrade, string> = { excellent: 'Excellent (2 %)', good: 'Good (5 %)', fair: 'Fair (8 %)', poor: 'Poor (over 8 %)' };

/** The gauging form of one site. */
export function GaugingEntry({ site }: { site: SiteRecord }) {
  const u = site.displayUnits;
  const su = u === 'us' ? 'ft' : 'm';
  const [form, dispatch] = useReducer(gaugingReducer, undefined, () => blankGaugingForm(''));
  const [ready, setReady] = useState(false);
  const [restored, setRestored] = useState<string>();
  const [errors, setErrors] = useState<FieldError[]>([]);
  const [saved, setSaved] = useState<string>();
  const [failure, setFailure] = useState<string>();
  const draft = useKeptDraft(form, ready, {
    form: 'gauging', siteId: site.id, hasContent, toFields: toDraftFields,
    onError: (err) => setFailure(`The draft could not be kept: ${plainError(err, { units: u, timeZone: site.timeZone })}`),
  });

  useEffect(() => {
    let live = true;
    void restorableDrafts('gauging', site.id).then((drafts) => {
      if (!live) return;
      const d = drafts[0];
      if (d) {
        draft.id.current = d.id;
        const { form: f, dropped } = fromDraftFields(d.fields, '');
        draft.markWritten(f);
        dispatch({ type: 'replace', form: f });
        setRestored(`Restored the unsaved gauging you started (last change ${formatTime(d.updated_ms, site.timeZone)}, ${f.verticals.length} verticals)${dropped ? `; ${dropped} unreadable vertical${dropped > 1 ? 's were' : ' was'} left out` : ''}.`);
      }
      setReady(true);
    });
    return () => {
      live = false;
    };
  }, [site.id]);

  const totals = useMemo(() => runningTotals(form.verticals), [form.verticals]);

  async function onSave(e: Event) {
    e.preventDefault();
    setSaved(undefined);
    setFailure(undefined);
    const parsed = parseGaugingForm(form, { units: u, timeZone: site.timeZone, now_ms: Date.now(), siteId: site.id });
    if (!parsed.ok) {
      setErrors(parsed.errors);
      document.getElementById(parsed.errors[0].field)?.focus();
      return;
    }
    setErrors([]);
    try {
      // The draft stays until the gauging itself is stored, and goes in the same transaction.
      await draft.flush();
      draft.pause(true);
      let g;
      try {
        g = await saveGauging(parsed.body, { draftId: draft.id.current });
        draft.id.current = undefined;
      } finally {
        draft.pause(false);
      }
      const { ratings } = await ratingsAndGaugings(site.id);
      const c = gaugingCheck(g, ratings);
      setSaved(
        `Saved: ${formatQuantity('discharge', g.discharge_m3s, u)} at ${formatQuantity('stage', g.meanStage_m, u)}. ` +
          (c ? `Deviation from the rating ${c.deviation_pct > 0 ? '+' : ''}${c.deviation_pct.toFixed(1)} %: ${c.checks ? `checks the rating within “${g.grade}”` : `does not check the rating within “${g.grade}”`}; it implies a shift of ${formatQuantity('stage', c.impliedShift_m, u)}.`
            : 'No rating in force at its time to compare with.'),
      );
      setRestored(undefined);
      const next = blankGaugingForm(form.observer);
      draft.markWritten(next);
      dispatch({ type: 'replace', form: next });
    } catch (err) {
      setFailure(`Not saved: ${plainError(err, { doing: 'save', units: u, timeZone: site.timeZone })}`);
    }
  }

  if (!ready) return <p aria-busy="true">Opening the form…</p>;
  const set = (field: 'timeText' | 'stageText' | 'startStageText' | 'endStageText' | 'dischargeText' | 'observer' | 'note') => (v: string) => dispatch({ type: 'set', field, value: v });
  const maxShare = totals ? Math.max(...totals.subsections.map((s) => s.share)) : 0;
  return (
    <form onSubmit={onSave} noValidate>
      <h2 id="screen-title" tabIndex={-1}>New gauging</h2>
      <p class="muted">{site.name} · {site.code}</p>
      {restored && (
        <p class="callout" role="status">{restored}{' '}
          <button type="button" onClick={() => { dispatch({ type: 'replace', form: blankGaugingForm(form.observer) }); setRestored(undefined); }}>Start over</button>
        </p>
      )}
      {saved && <p class="callout ok" role="status" data-testid="gauging-saved">{saved} <a href={href('sites', site.id, 'gaugings')}>All gaugings</a></p>}
      <fieldset>
        <legend>Entered as</legend>
        <label class="choice"><input type="radio" name="gmode" checked={form.mode === 'verticals'} onChange={() => dispatch({ type: 'mode', value: 'verticals' })} /> Vertical by vertical (mid-section)</label>
        <label class="choice"><input type="radio" name="gmode" checked={form.mode === 'summary'} onChange={() => dispatch({ type: 'mode', value: 'summary' })} /> Summary (discharge already worked out)</label>
      </fieldset>
      <Field id="gTime" label={`Time (${site.timeZone})`} hint={form.timeText ? undefined : 'now, unless you change it'} error={errorOf(errors, 'gTime')}>
        <input id="gTime" type="datetime-local" value={form.timeText || toLocalInput(Date.now(), site.timeZone)} aria-invalid={errorOf(errors, 'gTime') ? true : undefined}
          aria-describedby={describedBy('gTime', !form.timeText, !!errorOf(errors, 'gTime'))} onInput={(e) => set('timeText')(e.currentTarget.value)} />
      </Field>
      <fieldset>
        <legend>Stage</legend>
        <label class="choice"><input type="radio" name="gstage" checked={form.stageMode === 'mean'} onChange={() => dispatch({ type: 'stageMode', value: 'mean' })} /> Mean stage</label>
        <label class="choice"><input type="radio" name="gstage" checked={form.stageMode === 'start-end'} onChange={() => dispatch({ type: 'stageMode', value: 'start-end' })} /> Start and end stages (averaged)</label>
        {form.stageMode === 'mean' ? <NumberField id="gStage" label={`Mean stage (${su})`} value={form.stageText} errors={errors} onInput={set('stageText')} /> : (
          <div class="row two">
            <NumberField id="gStartStage" label={`At the start (${su})`} value={form.startStageText} errors={errors} onInput={set('startStageText')} />
            <NumberField id="gEndStage" label={`At the end (${su})`} value={form.endStageText} errors={errors} onInput={set('endStageText')} />
          </div>
        )}
      </fieldset>
      {form.mode === 'summary' ? (
        <>
          <NumberField id="gDischarge" label={`Measured discharge (${u === 'us' ? 'ft³/s' : 'm³/s'})`} value={form.dischargeText} errors={errors} onInput={set('dischargeText')} />
          <Field id="gMethod" label="Method">
            <select id="gMethod" value={form.method} onChange={(e) => dispatch({ type: 'method', value: e.currentTarget.value as GaugingMethod })}>
              {GAUGING_METHODS.map((m) => <option key={m} value={m}>{METHOD_LABELS[m]}</option>)}
            </select>
          </Field>
        </>
      ) : (
        <>
          <section class="card running" aria-live="polite" aria-label="Running totals">
            {totals ? (
              <dl class="facts">
                <dt>Discharge</dt><dd data-testid="running-discharge">{formatQuantity('discharge', totals.discharge_m3s, u)}</dd>
                <dt>Area</dt><dd>{formatArea_m2(totals.area_m2, u)}</dd>
                <dt>Mean velocity</dt><dd>{formatQuantity('velocity', totals.meanVelocity_mps, u)}</dd>
                <dt>Largest share</dt><dd>{(100 * maxShare).toFixed(1)} %{maxShare > MAX_SUBSECTION_SHARE && <> <span class="tag">over {100 * MAX_SUBSECTION_SHARE} %</span></>}</dd>
                <dt>Verticals</dt><dd>{form.verticals.length}{form.verticals.length < MIN_VERTICALS && <> <span class="tag">under {MIN_VERTICALS}</span></>}</dd>
              </dl>
            ) : <p class="muted">Totals appear once two verticals with depth between them are kept. {form.verticals.length} kept.</p>}
          </section>
          {totals && maxShare > MAX_SUBSECTION_SHARE && <p class="callout warn">A subsection carries {(100 * maxShare).toFixed(1)} % of the discharge; common practice is at most {100 * MAX_SUBSECTION_SHARE} % (ideally 5 %): add verticals there.</p>}
          {totals && form.verticals.length < MIN_VERTICALS && <p class="callout warn" data-testid="count-warning">{form.verticals.length} verticals so far; common practice asks at least {MIN_VERTICALS} (25–30 recommended).</p>}
          <Verticals form={form} dispatch={dispatch} units={u} />
        </>
      )}
      <Field id="gGrade" label="Grade">
        <select id="gGrade" value={form.grade} onChange={(e) => dispatch({ type: 'grade', value: e.currentTarget.value as MeasurementGrade })}>
          {GAUGING_GRADES.map((g) => <option key={g} value={g}>{GRADE_LABELS[g]}</option>)}
        </select>
      </Field>
      <Field id="gObserver" label="Observer"><input id="gObserver" autoComplete="name" value={form.observer} onInput={(e) => set('observer')(e.currentTarget.value)} /></Field>
      <Field id="gNote" label="Note"><textarea id="gNote" value={form.note} onInput={(e) => set('note')(e.currentTarget.value)} /></Field>
      {errorOf(errors, 'verticals') && <p class="callout bad" role="alert">{errorOf(errors, 'verticals')}</p>}
      {errors.length > 0 && !errorOf(errors, 'verticals') && <p class="callout bad" role="alert">Not saved: correct the marked fields.</p>}
      {failure && <p class="callout bad" role="alert">{failure}</p>}
      <button type="submit" class="primary wide">Save gauging</button>
      <Cautions compact />
    </form>
  );
}
