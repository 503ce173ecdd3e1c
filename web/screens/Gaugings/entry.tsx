// Entering a gauging, or correcting a saved one: a summary, or vertical by vertical (mid-section, ISO
// 748) with running totals, the largest subsection share, the count of verticals and the wading caution.
// The form is kept as a draft on every change and restored when the app reopens; saving shows the
// deviation from the rating. A correction is saved as a new revision of the same gauging.
import { useEffect, useMemo, useReducer, useState } from 'preact/hooks';
import {
  GAUGING_GRADES, GAUGING_METHODS, MAX_SUBSECTION_SHARE, MIN_VERTICALS, toLocalInput,
  type GaugingMethod, type GaugingRecord, type MeasurementGrade, type SiteRecord,
} from '../../../core';
import { getGauging, ratingsAndGaugings, saveGauging } from '../../db';
import { restorableDrafts, useKeptDraft } from '../../app/use-kept-draft';
import { plainError } from '../../plain-words';
import { Cautions } from '../../components/Cautions';
import { describedBy, errorOf, Field, type FieldError } from '../../components/Field';
import { NumberField } from '../../components/NumberField';
import { formatQuantity, formatTime } from '../../format';
import { href } from '../../router';
import { gaugingCheck } from './check';
import { blankGaugingForm, formOfGauging, gaugingReducer, type GaugingForm, type GaugingTextField } from './form';
import { fromDraftFields, hasContent, toDraftFields } from './form-draft';
import { parseGaugingForm } from './read-gauging';
import { runningTotals } from './read-vertical';
import { TotalsCard } from './totals-card';
import { Verticals } from './verticals';

const METHOD_LABELS: Record<GaugingMethod, string> = {
  'velocity-area': 'Current meter (velocity–area)', 'acoustic-profiler': 'Acoustic profiler', volumetric: 'Volumetric', dilution: 'Dilution', float: 'Floats', other: 'Other',
};
const GRADE_LABELS: Record<MeasurementGrade, string> = { excellent: 'Excellent (2 %)', good: 'Good (5 %)', fair: 'Fair (8 %)', poor: 'Poor (over 8 %)' };

/** The form a screen starts from: blank, or the saved gauging being corrected. */
const startForm = (site: SiteRecord, saved: GaugingRecord | undefined): GaugingForm => (saved ? formOfGauging(saved, site.timeZone, site.displayUnits) : blankGaugingForm(''));

/** The gauging form of one site: a new gauging, or a correction of `saved`. */
export function GaugingEntry({ site, saved }: { site: SiteRecord; saved?: GaugingRecord }) {
  const u = site.displayUnits;
  const su = u === 'us' ? 'ft' : 'm';
  const [form, dispatch] = useReducer(gaugingReducer, undefined, () => startForm(site, saved));
  const [ready, setReady] = useState(false);
  const [restored, setRestored] = useState<string>();
  const [errors, setErrors] = useState<FieldError[]>([]);
  const [done, setDone] = useState<string>();
  const [failure, setFailure] = useState<string>();
  const draft = useKeptDraft(form, ready, {
    form: 'gauging', siteId: site.id, hasContent, toFields: toDraftFields,
    onError: (err) => setFailure(`The draft could not be kept: ${plainError(err, { units: u, timeZone: site.timeZone })}`),
  });

  useEffect(() => {
    let live = true;
    draft.markWritten(form);
    void restorableDrafts('gauging', site.id).then((drafts) => {
      if (!live) return;
      // A new gauging restores a new gauging's draft; a correction only its own.
      const d = drafts.find((x) => {
        const s = x.fields.saved;
        const of = s && typeof s === 'object' && !Array.isArray(s) ? s.id : undefined;
        return saved ? of === saved.id : of === undefined;
      });
      if (d) {
        draft.id.current = d.id;
        const { form: f, dropped } = fromDraftFields(d.fields, '');
        draft.markWritten(f);
        dispatch({ type: 'replace', form: f });
        setRestored(`Restored the unsaved ${saved ? 'correction' : 'gauging'} you started (last change ${formatTime(d.updated_ms, site.timeZone)}, ${f.verticals.length} verticals)${dropped ? `; ${dropped} unreadable vertical${dropped > 1 ? 's were' : ' was'} left out` : ''}.`);
      }
      setReady(true);
    });
    return () => {
      live = false;
    };
  }, [site.id, saved?.id]);

  const totals = useMemo(() => runningTotals(form.verticals), [form.verticals]);

  async function onSave(e: Event) {
    e.preventDefault();
    setDone(undefined);
    setFailure(undefined);
    const parsed = parseGaugingForm(form, { units: u, timeZone: site.timeZone, now_ms: Date.now(), siteId: site.id });
    if (!parsed.ok) {
      setErrors(parsed.errors);
      document.getElementById(parsed.errors[0].field)?.focus();
      return;
    }
    setErrors([]);
    try {
      if (form.saved) {
        // Refuse to overwrite a revision this form never saw (changed in another tab or by a sync).
        const now = await getGauging(form.saved.id);
        if (!now || now.rev !== form.saved.rev) {
          setFailure('Not saved: this gauging was changed or deleted elsewhere since you opened it. Open it again to see the latest version.');
          return;
        }
      }
      // The draft stays until the gauging itself is stored, and goes in the same transaction.
      await draft.flush();
      draft.pause(true);
      let g;
      try {
        g = await saveGauging(form.saved ? { ...parsed.body, id: form.saved.id } : parsed.body, { draftId: draft.id.current });
        draft.id.current = undefined;
      } finally {
        draft.pause(false);
      }
      const { ratings } = await ratingsAndGaugings(site.id);
      const c = gaugingCheck(g, ratings);
      setDone(
        `${form.saved ? 'Correction saved' : 'Saved'}: ${formatQuantity('discharge', g.discharge_m3s, u)} at ${formatQuantity('stage', g.meanStage_m, u)}. ` +
          (c ? `Deviation from the rating ${c.deviation_pct > 0 ? '+' : ''}${c.deviation_pct.toFixed(1)} %: ${c.checks ? `checks the rating within “${g.grade}”` : `does not check the rating within “${g.grade}”`}; it implies a shift of ${formatQuantity('stage', c.impliedShift_m, u)}.`
            : 'No rating in force at its time to compare with.'),
      );
      setRestored(undefined);
      const next = form.saved ? formOfGauging(g, site.timeZone, u) : blankGaugingForm(form.observer);
      draft.markWritten(next);
      dispatch({ type: 'replace', form: next });
    } catch (err) {
      setFailure(`Not saved: ${plainError(err, { doing: 'save', units: u, timeZone: site.timeZone })}`);
    }
  }

  if (!ready) return <p aria-busy="true">Opening the form…</p>;
  const set = (field: GaugingTextField) => (v: string) => dispatch({ type: 'set', field, value: v });
  return (
    <form onSubmit={onSave} noValidate>
      <h2 id="screen-title" tabIndex={-1}>{form.saved ? 'Correct a gauging' : 'New gauging'}</h2>
      <p class="muted">{site.name} · {site.code}{form.saved && ' · saving keeps the earlier version in the record’s history'}</p>
      {restored && (
        <p class="callout" role="status">{restored}{' '}
          <button type="button" onClick={() => { dispatch({ type: 'replace', form: startForm(site, saved) }); setRestored(undefined); }}>Start over</button>
        </p>
      )}
      {done && <p class="callout ok" role="status" data-testid="gauging-saved">{done} <a href={href('sites', site.id, 'gaugings')}>All gaugings</a></p>}
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
          <TotalsCard totals={totals} count={form.verticals.length} units={u} />
          <Verticals form={form} dispatch={dispatch} units={u} totals={totals} />
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
      <button type="submit" class="primary wide">{form.saved ? 'Save the correction' : 'Save gauging'}</button>
      <Cautions compact />
    </form>
  );
}
