// Record a stage reading in a few taps: a big stage field, the time (now, or edited in the site's
// zone), source, quality, observer, note and an optional location. The discharge from the rating in
// force appears as the stage is typed, with plain warnings that never block saving. A half-filled form
// is kept as a draft on every change and restored when the app reopens.
import { useEffect, useMemo, useReducer, useRef, useState } from 'preact/hooks';
import {
  checkReading, fromDisplay, hasDischarge, MAX_ABS_STAGE_M, STAGE_DECIMALS, readLocalInput, displayUnit, READING_QUALITIES, READING_SOURCES, RecordValidationError,
  toDisplay, toLocalInput, type ReadingQuality, type ReadingSource, type SiteRecord, type UnitSystem,
} from '../../../core';
import { discardDraft, getReading, getSite, listDrafts, listRatings, listSites, readingBefore, saveDraft, saveReading, StorageError } from '../../db';
import type { ScreenProps } from '../../router';
import { onBeforeUpdate } from '../../app/updates';
import { useRecords } from '../../db/use-records';
import { Cautions } from '../../components/Cautions';
import { TimeChoice } from '../../components/TimeChoice';
import { locationProblem, plainError } from '../../plain-words';
import { LoggerCheck, loggerCheckValue } from '../../components/LoggerCheck';
import { describedBy, Field } from '../../components/Field';
import { formatQuantity, formatTime, parseDecimal, spaceInsideNumber } from '../../format';
import { href, navigate } from '../../router';
import { blankForm, formOfReading, formReducer, fromDraftFields, hasContent, toDraftFields, type ReadingForm } from './form';
import './style.css';

const OBSERVER_KEY = 'freshet.observer';
const DRAFT_DELAY_MS = 300;

const SOURCE_LABELS: Record<ReadingSource, string> = { staff: 'Staff gauge', 'wire-weight': 'Wire-weight gauge', 'crest-stage': 'Crest-stage gauge', logger: 'Logger display' };
const QUALITY_LABELS: Record<ReadingQuality, string> = { good: 'Good', fair: 'Fair', poor: 'Poor', estimated: 'Estimated' };

function rememberedObserver(): string {
  try {
    return localStorage.getItem(OBSERVER_KEY) ?? '';
  } catch {
    return '';
  }
}

/** "−1,000 to 1,000 m" (or ft): the stage a reading may hold, in the site's units. */
function stageLimitText(u: UnitSystem): string {
  const v = Number(toDisplay('stage', MAX_ABS_STAGE_M, u).toPrecision(6)).toLocaleString('en');
  return `−${v} to ${v} ${displayUnit('stage', u)}`;
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

/** Great-circle distance in km between two points (haversine, mean Earth radius 6371.0088 km). */
function distance_km(a: { lat: number; lon: number }, b: { lat: number; lon: number }): number {
  const rad = Math.PI / 180;
  const dLat = (b.lat - a.lat) * rad;
  const dLon = (b.lon - a.lon) * rad;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(a.lat * rad) * Math.cos(b.lat * rad) * Math.sin(dLon / 2) ** 2;
  return 2 * 6371.0088 * Math.asin(Math.min(1, Math.sqrt(h)));
}

/** Picks the site to record at, when the route names none; nearest first once the location is known. */
function ChooseSite() {
  const sites = useRecords(() => listSites(), ['site'], []);
  const [here, setHere] = useState<{ lat: number; lon: number }>();
  const [locating, setLocating] = useState<string>();
  const ordered = useMemo(() => {
    if (sites.state !== 'ready') return [];
    const withKm = sites.value.map((s) => ({ s, km: here && s.location ? distance_km(here, s.location) : undefined }));
    if (here) withKm.sort((a, b) => (a.km ?? Infinity) - (b.km ?? Infinity));
    return withKm;
  }, [sites, here]);
  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>Record a reading</h2>
      {sites.state === 'loading' && <p aria-busy="true">Reading the sites…</p>}
      {sites.state === 'failed' && <p class="callout bad" role="alert">{sites.message}</p>}
      {sites.state === 'ready' && sites.value.length === 0 && (
        <p>There is no site on this phone yet. <a href={href('sites')}>Add a site or load the demo site</a> first.</p>
      )}
      {sites.state === 'ready' && sites.value.length > 0 && (
        <>
          <p>Which site are you at?</p>
          {'geolocation' in navigator && !here && (
            <button
              type="button"
              class="wide"
              onClick={() => {
                setLocating('Finding your location…');
                navigator.geolocation.getCurrentPosition(
                  (p) => {
                    setHere({ lat: p.coords.latitude, lon: p.coords.longitude });
                    setLocating(undefined);
                  },
                  (err) => setLocating(`${locationProblem(err)} The sites stay in code order.`),
                  { enableHighAccuracy: false, timeout: 20_000, maximumAge: 300_000 },
                );
              }}
            >
              Nearest first
            </button>
          )}
          {locating && <p class="muted" role="status">{locating}</p>}
          <ul class="list card" aria-label="Sites">
            {ordered.map(({ s, km }) => (
              <li key={s.id}>
                <a class="item" href={href('record', s.id)}>
                  <span><strong>{s.name}</strong><span class="hint">{s.code}</span></span>
                  <span>{km !== undefined ? `${km < 10 ? km.toFixed(1) : Math.round(km)} km` : <span aria-hidden="true">›</span>}</span>
                </a>
              </li>
            ))}
          </ul>
        </>
      )}
    </>
  );
}

/** The reading form for one site; with readingId it edits that reading. */
function ReadingEntry({ site, readingId }: { site: SiteRecord; readingId?: string }) {
  const u = site.displayUnits;
  const [form, dispatch] = useReducer(formReducer, undefined, () => blankForm(rememberedObserver()));
  const [ready, setReady] = useState(false);
  const [restoredAt, setRestoredAt] = useState<number>();
  const [saving, setSaving] = useState(false);
  const [saved, setSaved] = useState<string>();
  const [error, setError] = useState<{ field?: string; text: string }>();
  const [gpsState, setGpsState] = useState<string>();
  /** Which instant the user picked for a time the clocks skipped or repeated (kept while the text is the same). */
  const [timeChoice, setTimeChoice] = useState<{ text: string; time_ms: number }>();
  const draftId = useRef<string | undefined>(undefined);
  const pendingDraft = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  const formRef = useRef(form);
  formRef.current = form;
  /** The form as last written to the draft (or restored from it): nothing to flush while they match. */
  const written = useRef<ReadingForm>(form);
  const now = useClock();

  // Open: restore this site's draft (for the same reading) or load the reading being edited.
  useEffect(() => {
    let live = true;
    void (async () => {
      const drafts = await listDrafts('reading', site.id);
      const draft = drafts.find((d) => (d.fields.readingId ?? undefined) === readingId);
      if (!live) return;
      if (draft) {
        draftId.current = draft.id;
        const restored = fromDraftFields(draft.fields, rememberedObserver());
        written.current = restored;
        dispatch({ type: 'replace', form: restored });
        setRestoredAt(draft.updated_ms);
      } else if (readingId) {
        const r = await getReading(readingId);
        if (!live) return;
        const shown = (m: number) => toDisplay('stage', m, u).toFixed(STAGE_DECIMALS[u]);
        if (r) {
          const timeText = toLocalInput(r.time_ms, site.timeZone);
          // A stored time in the repeated hour is already decided: keep its instant, do not ask again.
          setTimeChoice({ text: timeText, time_ms: r.time_ms });
          dispatch({ type: 'replace', form: formOfReading(r, shown(r.stage_m), timeText, r.loggerCheck && shown(r.loggerCheck.logger_m)) });
        }
        else setError({ text: 'That reading is not on this phone any more.' });
      }
      setReady(true);
    })();
    return () => {
      live = false;
    };
  }, [site.id, readingId]);

  const writeDraft = async (f: ReadingForm): Promise<void> => {
    written.current = f;
    if (!hasContent(f)) {
      if (draftId.current) {
        const id = draftId.current;
        draftId.current = undefined;
        await discardDraft(id);
      }
      return;
    }
    const d = await saveDraft({ ...(draftId.current && { id: draftId.current }), form: 'reading', siteId: site.id, fields: toDraftFields(f) });
    draftId.current = d.id;
  };
  /** Writes the form to the draft now if it changed since the last write (before an update, on hide, on leave). */
  const flushDraft = async (): Promise<void> => {
    clearTimeout(pendingDraft.current);
    pendingDraft.current = undefined;
    if (formRef.current === written.current) return;
    await writeDraft(formRef.current);
  };

  // Keep the draft on every change (debounced), before an accepted update, and when the app is hidden.
  useEffect(() => {
    if (!ready) return;
    clearTimeout(pendingDraft.current);
    pendingDraft.current = setTimeout(() => {
      pendingDraft.current = undefined;
      void writeDraft(formRef.current).catch((err: unknown) => setError({ text: `The draft could not be kept: ${plainError(err, { units: u, timeZone: site.timeZone })}` }));
    }, DRAFT_DELAY_MS);
  }, [form, ready]);
  useEffect(() => {
    const stopUpdate = onBeforeUpdate(flushDraft);
    const onHide = () => document.visibilityState === 'hidden' && void flushDraft();
    document.addEventListener('visibilitychange', onHide);
    return () => {
      stopUpdate();
      document.removeEventListener('visibilitychange', onHide);
      void flushDraft();
    };
  }, []);

  // What the typed values mean: stage in m, time in UTC ms (or why not).
  const stage = useMemo(() => {
    if (!form.stageText.trim()) return { empty: true as const };
    const v = parseDecimal(form.stageText);
    if (v === undefined) return { error: spaceInsideNumber(form.stageText) ?? `Type the stage as a number, like ${u === 'us' ? '2.41' : '0.734'}.` };
    const stage_m = fromDisplay('stage', v, u);
    // No gauge reads beyond the stored limit: refuse here, before an absurd discharge or jump is shown.
    if (Math.abs(stage_m) > MAX_ABS_STAGE_M) return { error: `The stage must be a number from ${stageLimitText(u)}; check the number.` };
    return { stage_m };
  }, [form.stageText, u]);
  const time = useMemo(() => {
    if (!form.timeText) return { time_ms: Math.floor(now / 1000) * 1000, followsClock: true };
    try {
      const answer = readLocalInput(form.timeText, site.timeZone);
      if (answer.kind === 'one') return { time_ms: answer.time_ms, followsClock: false };
      const picked = timeChoice?.text === form.timeText && answer.candidates_ms.includes(timeChoice.time_ms) ? timeChoice.time_ms : undefined;
      return picked === undefined ? { ask: answer, followsClock: false } : { time_ms: picked, ask: answer, followsClock: false };
    } catch (err) {
      return { error: (err as Error).message };
    }
  }, [form.timeText, now, site.timeZone, timeChoice]);
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
      stage_m: stage.stage_m!, time_ms: t, now_ms: now, jumpLimit_m: site.jumpLimit_m, units: u,
      previous: previous && { stage_m: previous.stage_m, time_ms: previous.time_ms },
      ratings,
    });
  }, [stage, t, now, context, site.jumpLimit_m, u]);

  async function onSave(e: Event) {
    e.preventDefault();
    setSaved(undefined);
    if (!('stage_m' in stage)) {
      setError({ field: 'stage', text: ('error' in stage && stage.error) || 'Type the stage first.' });
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
    setSaving(true);
    setError(undefined);
    try {
      await flushDraft(); // the draft stays until the reading itself is safely stored
      const record = await saveReading({
        ...(form.readingId && { id: form.readingId }),
        siteId: site.id, time_ms: t, stage_m: stage.stage_m!, source: form.source, quality: form.quality,
        observer: form.observer.trim(), note: form.note.trim(), warnings: check.warnings.map((w) => w.text),
        ...(form.gps && { gps: form.gps }),
        ...(loggerCheck && 'logger_m' in loggerCheck && { loggerCheck: { logger_m: loggerCheck.logger_m } }),
      });
      try {
        localStorage.setItem(OBSERVER_KEY, record.observer);
      } catch {
        // No local storage: the observer is simply not remembered.
      }
      if (draftId.current) {
        const id = draftId.current;
        draftId.current = undefined;
        await discardDraft(id);
      }
      clearTimeout(pendingDraft.current);
      pendingDraft.current = undefined;
      const q = !hasDischarge(check.discharge_m3s) ? 'no discharge (no rating)' : formatQuantity('discharge', check.discharge_m3s, u) + (check.extrapolated ? ', extrapolated' : '');
      setSaved(`Saved: ${formatQuantity('stage', record.stage_m, u)} at ${formatTime(record.time_ms, site.timeZone)}, ${q}.`);
      setRestoredAt(undefined);
      if (form.readingId) navigate(href('sites', site.id), true);
      else dispatch({ type: 'saved' });
    } catch (err) {
      const text = plainError(err, { doing: 'save', units: u, timeZone: site.timeZone });
      if (err instanceof RecordValidationError) setError({ field: err.field.startsWith('stage') ? 'stage' : err.field.startsWith('time') ? 'time' : undefined, text: `Not saved: ${text}` });
      else setError({ text: err instanceof StorageError ? text : `Not saved: ${text}` });
    } finally {
      setSaving(false);
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

  if (!ready) return <p aria-busy="true">Opening the form…</p>;
  const stageError = 'error' in stage ? stage.error : error?.field === 'stage' ? error.text : undefined;
  const timeError = 'error' in time ? time.error : error?.field === 'time' ? error.text : undefined;
  const unit = displayUnit('stage', u);
  return (
    <form class="record" onSubmit={onSave} noValidate>
      <h2 id="screen-title" tabIndex={-1}>{form.readingId ? 'Edit reading' : 'New reading'}</h2>
      <p class="muted">{site.name} · {site.code}</p>
      {restoredAt !== undefined && (
        <p class="callout" role="status">
          Restored the unsaved reading you started at {formatTime(restoredAt, site.timeZone)}.{' '}
          <button type="button" onClick={() => { dispatch({ type: 'replace', form: blankForm(form.observer) }); setRestoredAt(undefined); }}>Start over</button>
        </p>
      )}
      {saved && <p class="callout ok" role="status" data-testid="saved">{saved}</p>}
      <Field id="stage" label={`Stage (${unit})`} error={stageError}>
        <input
          id="stage"
          class="big"
          type="text"
          inputMode="decimal"
          autoComplete="off"
          enterKeyHint="done"
          placeholder={u === 'us' ? '0.00' : '0.000'}
          value={form.stageText}
          aria-invalid={stageError ? true : undefined}
          aria-describedby={describedBy('stage', false, !!stageError)}
          onInput={(e) => dispatch({ type: 'set', field: 'stageText', value: e.currentTarget.value })}
        />
      </Field>
      <section class="live card" aria-live="polite" aria-label="Discharge">
        {!check && <p class="muted">The discharge appears here as you type the stage.</p>}
        {check && (
          <>
            <p class="figure">
              <span data-testid="discharge">{!hasDischarge(check.discharge_m3s) ? 'No discharge' : formatQuantity('discharge', check.discharge_m3s, u)}</span>
              {check.extrapolated && <> <span class="tag">extrapolated</span></>}
            </p>
            {hasDischarge(check.discharge_m3s) && check.warnings.every((w) => w.code !== 'extrapolated' && w.code !== 'below-zero-flow') && (
              <p class="callout ok">Within the gauged range of the rating.</p>
            )}
            {check.shift_m !== 0 && <p class="muted">Includes a shift of {formatQuantity('stage', check.shift_m, u)}.</p>}
            {check.warnings.map((w) => (
              <p key={w.code} class="callout warn" data-warning={w.code}>{w.text}</p>
            ))}
            {check.warnings.length > 0 && <p class="hint">Warnings do not stop saving; they are stored with the reading.</p>}
          </>
        )}
      </section>
      <Field id="time" label={`Time (${site.timeZone})`} hint={time.followsClock ? 'now: follows the clock until you change it' : undefined} error={timeError}>
        <div class="row">
          <input
            id="time"
            type="datetime-local"
            value={form.timeText || toLocalInput(now, site.timeZone)}
            aria-invalid={timeError ? true : undefined}
            aria-describedby={describedBy('time', !!time.followsClock, !!timeError)}
            onInput={(e) => dispatch({ type: 'set', field: 'timeText', value: e.currentTarget.value })}
          />
          {!time.followsClock && <button type="button" style="flex:0 0 auto" onClick={() => dispatch({ type: 'set', field: 'timeText', value: '' })}>Now</button>}
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
        <input id="observer" autoComplete="name" value={form.observer} onInput={(e) => dispatch({ type: 'set', field: 'observer', value: e.currentTarget.value })} />
      </Field>
      <Field id="note" label="Note" hint="conditions: debris on the control, weed, ice, high water…">
        <textarea id="note" value={form.note} aria-describedby="note-hint" onInput={(e) => dispatch({ type: 'set', field: 'note', value: e.currentTarget.value })} />
      </Field>
      {form.gps ? (
        <p class="callout" data-testid="gps">
          Location {form.gps.lat.toFixed(5)}, {form.gps.lon.toFixed(5)} (± {Math.round(form.gps.accuracy_m)} m){' '}
          <button type="button" onClick={() => dispatch({ type: 'gps', value: undefined })}>Remove location</button>
        </p>
      ) : (
        <button type="button" class="wide" onClick={addLocation}>Add location</button>
      )}
      {gpsState && <p class="muted" role="status">{gpsState}</p>}
      {error && !error.field && <p class="callout bad" role="alert">{error.text}</p>}
      <button type="submit" class="primary wide save" disabled={saving}>{saving ? 'Saving…' : form.readingId ? 'Save changes' : 'Save reading'}</button>
      <p><a href={href('sites', site.id)}>Readings of this site</a></p>
      <Cautions compact />
    </form>
  );
}

/** The Record area: choose a site, then the reading form. */
export default function Record({ params }: ScreenProps) {
  const { siteId, readingId } = params;
  const site = useRecords(async () => (siteId ? getSite(siteId) : undefined), ['site'], [siteId]);
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
  return <ReadingEntry key={`${siteId}/${readingId ?? ''}`} site={site.value} readingId={readingId} />;
}
