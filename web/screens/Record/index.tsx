// Record a stage reading in a few taps: the stage field has focus, the time follows the clock (or is
// edited in the site's zone), then source, quality, observer, note and an optional location. Save and
// the live discharge sit in a bar at the bottom, in thumb reach. The form is kept as a draft from the
// first keystroke; the draft is removed in the same transaction that stores the reading.
import { useEffect, useMemo, useReducer, useRef, useState } from 'preact/hooks';
import {
  checkReading, displayUnit, hasDischarge, MS_PER_DAY, READING_QUALITIES, READING_SOURCES, RecordValidationError, STAGE_DECIMALS,
  toDisplay, toLocalInput, type ReadingQuality, type ReadingSource, type SiteRecord,
} from '../../../core';
import {
  deleteReading, getReading, getSite, listRatings, readingBefore, saveReading, StorageError,
} from '../../db';
import { useRecords } from '../../db/use-records';
import { Cautions } from '../../components/Cautions';
import { TimeChoice } from '../../components/TimeChoice';
import { locationProblem, plainError } from '../../plain-words';
import { LoggerCheck, loggerCheckValue } from '../../components/LoggerCheck';
import { describedBy, Field } from '../../components/Field';
import { formatQuantity, formatTime } from '../../format';
import { href, navigate, type ScreenProps } from '../../router';
import { ChooseSite } from './choose-site';
import { restorableDrafts, useKeptDraft } from '../../app/use-kept-draft';
import { blankForm, formOfReading, formReducer, fromDraftFields, hasContent, stageOf, timeOf, toDraftFields } from './form';
import './style.css';

const OBSERVER_KEY = 'freshet.observer';
/** How long "Saved" offers its undo, ms. */
const UNDO_MS = 8_000;

const SOURCE_LABELS: Record<ReadingSource, string> = { staff: 'Staff gauge', 'wire-weight': 'Wire-weight gauge', 'crest-stage': 'Crest-stage gauge', logger: 'Logger display' };
const QUALITY_LABELS: Record<ReadingQuality, string> = { good: 'Good', fair: 'Fair', poor: 'Poor', estimated: 'Estimated' };

function rememberedObserver(): string {
  try {
    return localStorage.getItem(OBSERVER_KEY) ?? '';
  } catch {
    return '';
  }
}

/** Ticks every 30 s so a time that follows the clock stays current. */
function useClock(): number {
  const [now, setNow] = useState(Date.now());
  useEffect(() => {
    const t = setInterval(() => setNow(Date.now()), 30_000);
    return () => clearInterval(t);
  }, []);
  return now;
}

/** The reading form for one site; with readingId it edits that reading. */
function ReadingEntry({ site, readingId }: { site: SiteRecord; readingId?: string }) {
  const u = site.displayUnits;
  const [form, dispatch] = useReducer(formReducer, undefined, () => blankForm(rememberedObserver()));
  const [ready, setReady] = useState(false);
  const [restoredAt, setRestoredAt] = useState<number>();
  const [saving, setSaving] = useState(false);
  const [saved, setSaved] = useState<{ text: string; id?: string }>();
  const [error, setError] = useState<{ field?: string; text: string }>();
  const [futureOk, setFutureOk] = useState<number>();
  const [gpsState, setGpsState] = useState<string>();
  /** Which instant the user picked for a time the clocks skipped or repeated (kept while the text is the same). */
  const [timeChoice, setTimeChoice] = useState<{ text: string; time_ms: number }>();
  const draft = useKeptDraft(form, ready, {
    form: 'reading', siteId: site.id, hasContent, toFields: toDraftFields,
    onError: (err) => setError({ text: `The draft could not be kept: ${plainError(err, { units: u, timeZone: site.timeZone })}` }),
  });
  const stageInput = useRef<HTMLInputElement>(null);
  const noteInput = useRef<HTMLTextAreaElement>(null);
  const now = useClock();

  // Open: restore this form's draft (of this tab, or of a tab that is gone), or load the reading edited.
  useEffect(() => {
    let live = true;
    void (async () => {
      const [kept] = (await restorableDrafts('reading', site.id)).filter((d) => (d.fields.readingId ?? undefined) === readingId);
      if (!live) return;
      if (kept) {
        draft.id.current = kept.id;
        const restored = fromDraftFields(kept.fields, rememberedObserver());
        draft.markWritten(restored);
        dispatch({ type: 'replace', form: restored });
        setRestoredAt(kept.updated_ms);
      } else if (readingId) {
        const r = await getReading(readingId);
        if (!live) return;
        if (r) {
          const shown = (m: number) => toDisplay('stage', m, u).toFixed(STAGE_DECIMALS[u]);
          const loaded = formOfReading(r, shown(r.stage_m), toLocalInput(r.time_ms, site.timeZone), r.loggerCheck && shown(r.loggerCheck.logger_m));
          draft.markWritten(loaded);
          dispatch({ type: 'replace', form: loaded });
        } else setError({ text: 'That reading is not on this phone any more.' });
      }
      setReady(true);
    })();
    return () => {
      live = false;
    };
  }, [site.id, readingId]);
  useEffect(() => {
    if (ready) stageInput.current?.focus({ preventScroll: true });
  }, [ready]);

  useEffect(() => {
    if (!saved?.id) return;
    const t = setTimeout(() => setSaved((s) => (s ? { text: s.text } : s)), UNDO_MS);
    return () => clearTimeout(t);
  }, [saved]);

  const stage = useMemo(() => stageOf(form, u), [form.stageText, form.editing, u]);
  const time = useMemo(() => timeOf(form, site.timeZone, now, timeChoice), [form.timeText, form.editing, now, site.timeZone, timeChoice]);
  const t = 'time_ms' in time ? time.time_ms : undefined;
  const context = useRecords(
    async () => {
      if (t === undefined) return undefined;
      const [ratings, previous] = await Promise.all([listRatings(site.id), readingBefore(site.id, t, readingId)]);
      return { ratings, previous };
    },
    ['rating', 'reading'],
    [site.id, t === undefined ? 'none' : Math.floor(t / 60_000), readingId],
  );
  const check = useMemo(() => {
    if (!('stage_m' in stage) || t === undefined || context.state !== 'ready' || !context.value) return undefined;
    const { ratings, previous } = context.value;
    return checkReading({
      stage_m: stage.stage_m, time_ms: t, now_ms: now, jumpLimit_m: site.jumpLimit_m, units: u, ratings,
      previous: previous && { stage_m: previous.stage_m, time_ms: previous.time_ms },
    });
  }, [stage, t, now, context, site.jumpLimit_m, u]);
  const jump = !!check?.warnings.some((w) => w.code === 'jump');

  async function onSave(e: Event) {
    e.preventDefault();
    setSaved(undefined);
    if (!('stage_m' in stage)) {
      setError({ field: 'stage', text: ('error' in stage && stage.error) || 'Type the stage first.' });
      stageInput.current?.focus();
      return;
    }
    if (t === undefined || !check) {
      setError({ field: 'time', text: ('error' in time && time.error) || ('ask' in time ? 'Choose which of the two times below was meant.' : 'The time could not be read yet; try again.') });
      return;
    }
    const loggerCheck = loggerCheckValue(form.loggerCheckText, u);
    if (form.loggerCheckText !== undefined && !(loggerCheck && 'logger_m' in loggerCheck)) {
      setError({ field: 'logger-value', text: (loggerCheck && 'error' in loggerCheck && loggerCheck.error) || 'Type the value the logger shows, or untick the check.' });
      return;
    }
    if (loggerCheck && form.source === 'logger') {
      setError({ field: 'logger-value', text: 'A check compares the logger with a gauge: choose the gauge you read in “Read from”.' });
      return;
    }
    // A time more than a day ahead is most likely a typing slip in the date: ask before keeping it.
    if (t > now + MS_PER_DAY && futureOk !== t) {
      setError({ field: 'future', text: `The time ${formatTime(t, site.timeZone)} is more than a day ahead of this phone's clock. Check the date.` });
      return;
    }
    setSaving(true);
    setError(undefined);
    try {
      await draft.flush(); // the draft stays until the reading itself is stored, in the same transaction
      draft.pause(true);
      const record = await saveReading(
        {
          ...(form.editing && { id: form.editing.id }),
          siteId: site.id, time_ms: t, stage_m: stage.stage_m, source: form.source, quality: form.quality,
          observer: form.observer.trim(), note: form.note.trim(), warnings: check.warnings.map((w) => w.text),
          ...(form.gps && { gps: form.gps }),
          ...(loggerCheck && 'logger_m' in loggerCheck && { loggerCheck: { logger_m: loggerCheck.logger_m } }),
        },
        { draftId: draft.id.current, expectedRev: form.editing?.rev },
      );
      draft.id.current = undefined;
      try {
        localStorage.setItem(OBSERVER_KEY, record.observer);
      } catch {
        // No local storage: the observer is simply not remembered.
      }
      const q = !hasDischarge(check.discharge_m3s) ? 'no discharge (no rating)' : formatQuantity('discharge', check.discharge_m3s, u) + (check.extrapolated ? ', extrapolated' : '');
      const text = `Saved: ${formatQuantity('stage', record.stage_m, u)} at ${formatTime(record.time_ms, site.timeZone)}, ${q}.`;
      setRestoredAt(undefined);
      setFutureOk(undefined);
      if (form.editing) navigate(href('sites', site.id), true);
      else {
        const next = formReducer(form, { type: 'saved' });
        draft.markWritten(next);
        dispatch({ type: 'replace', form: next });
        setSaved({ text, id: record.id });
        stageInput.current?.focus({ preventScroll: true });
      }
    } catch (err) {
      const text = plainError(err, { doing: 'save', units: u, timeZone: site.timeZone });
      if (err instanceof RecordValidationError) setError({ field: err.field.startsWith('stage') ? 'stage' : err.field.startsWith('time') ? 'time' : undefined, text: `Not saved: ${text}` });
      else setError({ text: err instanceof StorageError ? text : `Not saved: ${text}` });
    } finally {
      draft.pause(false);
      setSaving(false);
    }
  }

  async function undoSave(id: string) {
    try {
      await deleteReading(id);
      setSaved({ text: 'The reading just saved was taken back.' });
    } catch (err) {
      setError({ text: err instanceof Error ? err.message : String(err) });
    }
  }

  function addLocation() {
    if (!('geolocation' in navigator)) {
      setGpsState('This phone gives no location to the browser.');
      return;
    }
    setGpsState('Finding your location…');
    navigator.geolocation.getCurrentPosition(
      (p) => {
        dispatch({ type: 'gps', value: { lat: p.coords.latitude, lon: p.coords.longitude, accuracy_m: p.coords.accuracy, time_ms: Math.round(p.timestamp) } });
        setGpsState(undefined);
      },
      (err) => setGpsState(`${locationProblem(err)} The reading can be saved without it.`),
      { enableHighAccuracy: true, timeout: 30_000, maximumAge: 60_000 },
    );
  }

  /** The enter key moves to the next field; it never saves (Save is its own button in the bar). */
  function nextOnEnter(e: KeyboardEvent) {
    if (e.key !== 'Enter' || e.target instanceof HTMLTextAreaElement || e.target instanceof HTMLButtonElement) return;
    e.preventDefault();
    const fields = [...(e.currentTarget as HTMLFormElement).querySelectorAll<HTMLElement>('input, select, textarea')];
    fields[fields.indexOf(e.target as HTMLElement) + 1]?.focus();
  }

  if (!ready) return <p aria-busy="true">Opening the form…</p>;
  const stageError = 'error' in stage ? stage.error : error?.field === 'stage' ? error.text : undefined;
  const timeError = 'error' in time ? time.error : error?.field === 'time' ? error.text : undefined;
  const unit = displayUnit('stage', u);
  const discharge = !check ? 'Discharge: type the stage' : !hasDischarge(check.discharge_m3s) ? 'No discharge' : formatQuantity('discharge', check.discharge_m3s, u);
  return (
    <form class="record" onSubmit={onSave} onKeyDown={nextOnEnter} noValidate>
      <h2 id="screen-title" tabIndex={-1}>{form.editing ? 'Edit reading' : 'New reading'}</h2>
      <p class="muted">{site.name} · {site.code}</p>
      {restoredAt !== undefined && (
        <p class="callout" role="status">
          Restored the unsaved reading you started at {formatTime(restoredAt, site.timeZone)}.{' '}
          <button type="button" onClick={() => { dispatch({ type: 'replace', form: blankForm(form.observer) }); setRestoredAt(undefined); setError(undefined); }}>Start over</button>
        </p>
      )}
      <Field id="stage" label={`Stage (${unit})`} error={stageError}>
        <input
          id="stage"
          ref={stageInput}
          class="big"
          type="text"
          inputMode="decimal"
          autoComplete="off"
          enterKeyHint="next"
          placeholder={u === 'us' ? '0.00' : '0.000'}
          value={form.stageText}
          aria-invalid={stageError ? true : undefined}
          aria-describedby={describedBy('stage', false, !!stageError)}
          onInput={(e) => dispatch({ type: 'set', field: 'stageText', value: e.currentTarget.value })}
        />
      </Field>
      {check && (
        <section class="live card" aria-label="Discharge details">
          {hasDischarge(check.discharge_m3s) && check.warnings.every((w) => w.code !== 'extrapolated' && w.code !== 'below-zero-flow') && (
            <p class="callout ok">Within the gauged range of the rating.</p>
          )}
          {check.shift_m !== 0 && <p class="muted">Includes a shift of {formatQuantity('stage', check.shift_m, u)}.</p>}
          {check.warnings.map((w) => (
            <p key={w.code} class="callout warn" data-warning={w.code}>
              {w.text}
              {w.code === 'jump' && <> <button type="button" onClick={() => noteInput.current?.focus()}>Add a note</button></>}
            </p>
          ))}
          {check.warnings.length > 0 && <p class="hint">Warnings do not stop saving; they are stored with the reading.</p>}
        </section>
      )}
      <Field id="time" label={`Time (${site.timeZone})`} hint={'followsClock' in time && time.followsClock ? 'now: follows the clock until you change it' : undefined} error={timeError}>
        <div class="row">
          <input
            id="time"
            type="datetime-local"
            value={form.timeText || toLocalInput(now, site.timeZone)}
            aria-invalid={timeError ? true : undefined}
            aria-describedby={describedBy('time', 'followsClock' in time && time.followsClock, !!timeError)}
            onInput={(e) => dispatch({ type: 'set', field: 'timeText', value: e.currentTarget.value })}
          />
          {!('followsClock' in time && time.followsClock) && <button type="button" style="flex:0 0 auto" onClick={() => dispatch({ type: 'set', field: 'timeText', value: '' })}>Now</button>}
        </div>
        {'ask' in time && time.ask && (
          <TimeChoice
            id="time-choice"
            typed={form.timeText}
            answer={time.ask}
            timeZone={site.timeZone}
            chosen_ms={'time_ms' in time ? time.time_ms : undefined}
            onChoose={(time_ms) => {
              setTimeChoice({ text: form.timeText, time_ms });
              if (error?.field === 'time') setError(undefined);
            }}
          />
        )}
      </Field>
      <div class="row two">
        <Field id="source" label="Read from">
          <select id="source" value={form.source} onChange={(e) => dispatch({ type: 'source', value: e.currentTarget.value as ReadingSource })}>
            {READING_SOURCES.map((s) => <option key={s} value={s}>{SOURCE_LABELS[s]}</option>)}
          </select>
        </Field>
        <Field id="quality" label="Quality">
          <select id="quality" value={form.quality} onChange={(e) => dispatch({ type: 'quality', value: e.currentTarget.value as ReadingQuality })}>
            {READING_QUALITIES.map((q) => <option key={q} value={q}>{QUALITY_LABELS[q]}</option>)}
          </select>
        </Field>
      </div>
      <LoggerCheck value={form.loggerCheckText} stage_m={'stage_m' in stage ? stage.stage_m : undefined} units={u}
        error={error?.field === 'logger-value' ? error.text : undefined} onChange={(value) => dispatch({ type: 'loggerCheck', value })} />
      <Field id="observer" label="Observer">
        <input id="observer" autoComplete="name" enterKeyHint="next" value={form.observer} onInput={(e) => dispatch({ type: 'set', field: 'observer', value: e.currentTarget.value })} />
      </Field>
      <div class={jump ? 'note-wanted' : undefined}>
        <Field id="note" label="Note" hint={jump ? 'say why the stage jumped, if it is right' : 'conditions: debris on the control, weed, ice, high water…'}>
          <textarea id="note" ref={noteInput} value={form.note} aria-describedby="note-hint" onInput={(e) => dispatch({ type: 'set', field: 'note', value: e.currentTarget.value })} />
        </Field>
      </div>
      {form.gps ? (
        <p class="callout" data-testid="gps">
          Location {form.gps.lat.toFixed(5)}, {form.gps.lon.toFixed(5)} (± {Math.round(form.gps.accuracy_m)} m){' '}
          <button type="button" onClick={() => dispatch({ type: 'gps', value: undefined })}>Remove location</button>
        </p>
      ) : (
        <button type="button" class="wide" onClick={addLocation}>Add location</button>
      )}
      {gpsState && <p class="muted" role="status">{gpsState}</p>}
      <p><a href={href('sites', site.id)}>Readings of this site</a></p>
      <Cautions compact />
      <div class="savebar" data-testid="savebar">
        <div aria-live="polite">
          {saved && (
            <p class="callout ok" role="status" data-testid="saved">
              {saved.text}
              {saved.id && <> <button type="button" onClick={() => void undoSave(saved.id!)}>Undo</button></>}
            </p>
          )}
          {error && error.field !== 'stage' && error.field !== 'time' && error.field !== 'logger-value' && (
            <p class="callout bad" role="alert">
              {error.text}
              {error.field === 'future' && t !== undefined && <> <button type="button" onClick={() => setFutureOk(t)}>Keep this time</button></>}
            </p>
          )}
        </div>
        <div class="row">
          <p class="figure" aria-live="polite" aria-label="Discharge">
            <span data-testid="discharge">{discharge}</span>
            {check?.extrapolated && <> <span class="tag">extrapolated</span></>}
          </p>
          <button type="submit" class="primary save" disabled={saving}>{saving ? 'Saving…' : form.editing ? 'Save changes' : 'Save reading'}</button>
        </div>
      </div>
    </form>
  );
}

/** The Record area: choose a site, then the reading form ('#/record/<siteId>[/<readingId>]'). */
export default function Record({ params }: ScreenProps) {
  const { siteId, readingId } = params;
  // A link to a reading this phone does not hold (never synced here, deleted, or of another site) says so
  // rather than opening a blank form under that address.
  const site = useRecords(async () => (siteId ? getSite(siteId) : undefined), ['site'], [siteId]);
  // Read once per link (no kinds to re-read on): a reading deleted while its form is open keeps the form.
  const reading = useRecords(async () => !readingId || (await getReading(readingId))?.siteId === siteId, [], [siteId, readingId]);
  if (!siteId) return <ChooseSite />;
  if (site.state === 'loading') return <p aria-busy="true">Opening the site…</p>;
  if (site.state === 'failed') return <p class="callout bad" role="alert">{site.message}</p>;
  if (!site.value) {
    return (
      <>
        <h2 id="screen-title" tabIndex={-1}>Site not found</h2>
        <p>This site is not on this phone. <a href={href('record')}>Choose another site</a></p>
      </>
    );
  }
  if (reading.state === 'ready' && !reading.value) {
    return (
      <>
        <h2 id="screen-title" tabIndex={-1}>Reading not found</h2>
        <p role="alert">This reading is not on this phone: it may have been deleted, or it was never copied here. <a href={href('sites', site.value.id)}>See the site’s readings</a> or <a href={href('record', site.value.id)}>record a new reading</a>.</p>
      </>
    );
  }
  if (reading.state === 'loading') return <p aria-busy="true">Opening the reading…</p>;
  return <ReadingEntry key={`${siteId}/${readingId ?? ''}`} site={site.value} readingId={readingId} />;
}
