// Fitting a rating to chosen gaugings: tick gaugings (the latest ticked at first), one or two segments
// (breakpoint typed or slid), offset found by the fit (Johnson's estimate as its start) or fixed. Shows
// the standard error, each gauging's deviation and the core's warnings; "Keep this rating" saves it.
import { useMemo, useState } from 'preact/hooks';
import { johnsonOffset, toDisplay, toLocalInput, type SiteRecord } from '../../../core';
import { ratingsAndGaugings, saveRating } from '../../db';
import { useRecords } from '../../components/use-records';
import { errorOf, Field } from '../../components/Field';
import { formatQuantity, formatTime } from '../../format';
import { href, navigate } from '../../router';
import { rangeText, segmentFormula, unitLabels } from './describe';
import { NumberField } from '../../components/NumberField';
import { DEFAULT_FIT_CHOICES, defaultSelection, plainFitWarning, runFit, type FitChoices } from './fit-choice';
import { plainError } from '../../plain-words';
import { readValidFrom } from './rating-form';

/** The fit screen of one site. */
export function FitRating({ site }: { site: SiteRecord }) {
  const data = useRecords(() => ratingsAndGaugings(site.id), ['gauging'], [site.id]);
  if (data.state === 'loading') return <p aria-busy="true">Reading the gaugings…</p>;
  if (data.state === 'failed') return <p class="callout bad" role="alert">{data.message}</p>;
  return <FitForm site={site} gaugings={data.value.gaugings} />;
}

function FitForm({ site, gaugings }: { site: SiteRecord; gaugings: Awaited<ReturnType<typeof ratingsAndGaugings>>['gaugings'] }) {
  const u = site.displayUnits;
  const { su } = unitLabels(u);
  const [selected, setSelected] = useState(() => defaultSelection(gaugings));
  const [choices, setChoices] = useState<FitChoices>(DEFAULT_FIT_CHOICES);
  const [validFromText, setValidFromText] = useState(() => toLocalInput(Date.now(), site.timeZone));
  const [note, setNote] = useState('');
  const [failure, setFailure] = useState<string>();
  const outcome = useMemo(() => runFit(gaugings, selected, choices, u), [gaugings, selected, choices, u]);
  const johnson = useMemo(() => {
    try {
      return johnsonOffset(gaugings.filter((g) => selected.has(g.id) && g.discharge_m3s > 0).map((g) => ({ stage_m: g.meanStage_m, discharge_m3s: g.discharge_m3s })));
    } catch {
      // Too few or too straight gaugings for the three-point estimate: the fit searches without it.
      return undefined;
    }
  }, [gaugings, selected]);
  const stages = gaugings.map((g) => g.meanStage_m);
  const lo = stages.length ? toDisplay('stage', Math.min(...stages), u) : 0;
  const hi = stages.length ? toDisplay('stage', Math.max(...stages), u) : 1;
  const errors = outcome.ok ? [] : outcome.errors;
  const deviation = new Map<string, number>();
  if (outcome.ok) outcome.used.forEach((g, i) => deviation.set(g.id, outcome.fit.deviations_pct[i]));
  const set = (patch: Partial<FitChoices>) => setChoices({ ...choices, ...patch });
  const newest = [...gaugings].reverse();

  async function keep() {
    setFailure(undefined);
    if (!outcome.ok) return;
    const from = readValidFrom(validFromText, site.timeZone, Date.now());
    if (!from.ok) {
      setFailure('Not saved: give the date and time the rating applies from, not in the future.');
      return;
    }
    const { validFrom_ms } = from;
    try {
      const saved = await saveRating({
        siteId: site.id, validFrom_ms, segments: outcome.fit.rating.segments, gaugedRange_m: outcome.fit.rating.gaugedRange_m, shifts: [],
        fittedFrom: outcome.used.map((g) => g.id), note: note.trim(),
        fit: { standardError_pct: outcome.fit.standardError_pct, gaugingCount: outcome.used.length, warnings: outcome.fit.warnings },
      });
      navigate(href('sites', site.id, 'ratings', saved.id), true);
    } catch (err) {
      setFailure(`Not saved: ${plainError(err, { doing: 'save' })}`);
    }
  }

  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>Fit a rating to gaugings</h2>
      {gaugings.length === 0 && <p class="callout warn">This site has no gaugings yet. <a href={href('sites', site.id, 'gaugings', 'new')}>Record a gauging</a> first.</p>}
      <fieldset>
        <legend>Segments</legend>
        <label class="choice"><input type="radio" name="segs" checked={choices.segmentCount === 1} onChange={() => set({ segmentCount: 1 })} /> One segment</label>
        <label class="choice"><input type="radio" name="segs" checked={choices.segmentCount === 2} onChange={() => set({ segmentCount: 2, breakpointText: choices.breakpointText || ((lo + hi) / 2).toFixed(u === 'us' ? 2 : 3) })} /> Two segments, split at a breakpoint</label>
        {choices.segmentCount === 2 && (
          <>
            <NumberField id="breakpoint" label={`Breakpoint (${su})`} value={choices.breakpointText} errors={errors} onInput={(v) => set({ breakpointText: v })} />
            <label for="breakpoint-slide" class="hint">Slide to move the breakpoint</label>
            <input id="breakpoint-slide" type="range" min={lo} max={hi} step={u === 'us' ? 0.01 : 0.005} value={Number(choices.breakpointText) || lo}
              onInput={(e) => set({ breakpointText: Number(e.currentTarget.value).toFixed(u === 'us' ? 2 : 3) })} />
            <label class="choice"><input type="checkbox" checked={choices.join} onChange={(e) => set({ join: e.currentTarget.checked })} /> Join the upper segment to the lower at the breakpoint</label>
          </>
        )}
      </fieldset>
      <fieldset>
        <legend>Offset (stage of zero flow{choices.segmentCount === 2 ? ', lower segment' : ''})</legend>
        <label class="choice"><input type="radio" name="offset" checked={choices.offsetMode === 'fit'} onChange={() => set({ offsetMode: 'fit' })} /> Found by the fit, starting from Johnson’s estimate</label>
        <label class="choice"><input type="radio" name="offset" checked={choices.offsetMode === 'fixed'}
          onChange={() => set({ offsetMode: 'fixed', offsetText: choices.offsetText || (johnson !== undefined ? toDisplay('stage', johnson, u).toFixed(u === 'us' ? 2 : 3) : '') })} /> Fixed (a surveyed control)</label>
        <p class="hint" data-testid="johnson">Johnson’s estimate from the ticked gaugings: {johnson === undefined ? 'not available' : formatQuantity('stage', johnson, u)}</p>
        {choices.offsetMode === 'fixed' && <NumberField id="offset" label={`Fixed offset (${su})`} value={choices.offsetText} errors={errors} onInput={(v) => set({ offsetText: v })} />}
      </fieldset>
      <section class="card" aria-live="polite" aria-label="Fit">
        {outcome.ok ? (
          <>
            <p class="figure"><span data-testid="standard-error">{outcome.fit.standardError_pct.toFixed(2)} %</span> <small>standard error</small></p>
            <p class="hint">{outcome.used.length} gaugings, {outcome.fit.degreesOfFreedom} degrees of freedom · {rangeText(outcome.fit.rating.gaugedRange_m, u)}</p>
            {outcome.fit.rating.segments.map((s, i, all) => <p key={i} class="formula">{segmentFormula(all, i, u)}</p>)}
            {outcome.fit.warnings.map((w, i) => <p key={i} class="callout warn">{plainFitWarning(w)}</p>)}
          </>
        ) : (
          outcome.errors.filter((e) => e.field === 'gaugings').map((e) => <p key={e.text} class="callout bad" role="alert">{e.text}</p>)
        )}
      </section>
      <h3>Gaugings ({selected.size} ticked)</h3>
      <ul class="checks card" aria-label="Gaugings to fit">
        {newest.map((g) => {
          const d = deviation.get(g.id);
          return (
            <li key={g.id}>
              <label class="choice">
                <input type="checkbox" checked={selected.has(g.id)} onChange={(e) => {
                  const next = new Set(selected);
                  if (e.currentTarget.checked) next.add(g.id);
                  else next.delete(g.id);
                  setSelected(next);
                }} />
                <span>
                  {formatTime(g.time_ms, site.timeZone)} · {formatQuantity('stage', g.meanStage_m, u)} · {formatQuantity('discharge', g.discharge_m3s, u)}
                  {d !== undefined && <span class="hint">deviation {d > 0 ? '+' : ''}{d.toFixed(1)} %</span>}
                </span>
              </label>
            </li>
          );
        })}
      </ul>
      <Field id="fitValidFrom" label={`Applies from (${site.timeZone})`}>
        <input id="fitValidFrom" type="datetime-local" value={validFromText} onInput={(e) => setValidFromText(e.currentTarget.value)} />
      </Field>
      <Field id="fitNote" label="Note">
        <textarea id="fitNote" value={note} onInput={(e) => setNote(e.currentTarget.value)} />
      </Field>
      {failure && <p class="callout bad" role="alert">{failure}</p>}
      <button type="button" class="primary wide" disabled={!outcome.ok} onClick={() => void keep()}>Keep this rating</button>
      {!outcome.ok && errorOf(errors, 'gaugings') === undefined && <p class="hint">Correct the marked choices to see the fit.</p>}
    </>
  );
}
