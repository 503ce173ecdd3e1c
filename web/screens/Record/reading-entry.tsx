// The reading form: record a stage reading in a few taps: the stage field has focus, the time follows the clock (or is
// edited in the site's zone), then source, quality, observer, note and an optional location. Save and
// the live discharge sit in a bar at the bottom, in thumb reach. The form is kept as a draft from the
// first keystroke; the draft is removed in the same transaction that stores the reading.
import { useEffect, useMemo, useReducer, useRef, useState } from 'preact/hooks';
import {
  checkReading, hasDischarge, MS_PER_DAY, RecordValidationError, STAGE_DECIMALS, toDisplay, toLocalInput, type SiteRecord,
} from '../../../core';
import {
  deleteReading, getReading, listRatings, readingBefore, saveReading, StorageError,
} from '../../db';
import { useRecords } from '../../components/use-records';
import { Cautions } from '../../components/Cautions';
import { plainError } from '../../plain-words';
import { LoggerCheck, loggerCheckValue } from '../../components/LoggerCheck';
import { formatQuantity, formatTime } from '../../format';
import { href, navigate, type ScreenProps } from '../../router';
import { StageField } from './stage-field';
import { LocationField } from './location-field';
import { SaveBar, type BarMessage } from './save-bar';
import { useClock } from './use-clock';
import { nextOnEnter, ObserverNote, SourceQuality, TimeField } from './fields';
import { restorableDrafts, useKeptDraft } from '../../app/use-kept-draft';
import { keepPending, PendingPhotos, Photos, type PendingPhoto } from '../../components/Photos';
import { blankForm, formOfReading, formReducer, fromDraftFields, hasContent, stageOf, timeOf, toDraftFields } from './form';
import './style.css';

const OBSERVER_KEY = 'freshet.observer';
/** How long "Saved" offers its undo, ms. */
const UNDO_MS = 8_000;

function rememberedObserver(): string {
  try {
    return localStorage.getItem(OBSERVER_KEY) ?? '';
  } catch {
    return '';
  }
}

/** The reading form for one site; with readingId it edits that reading. */
export function ReadingEntry({ site, readingId }: { site: SiteRecord; readingId?: string }) {
  const u = site.displayUnits;
  const [form, dispatch] = useReducer(formReducer, undefined, () => blankForm(rememberedObserver()));
  const [ready, setReady] = useState(false);
  const [restoredAt, setRestoredAt] = useState<number>();
  const [saving, setSaving] = useState(false);
  const [saved, setSaved] = useState<{ text: string; id?: string }>();
  const [error, setError] = useState<{ field?: string; text: string }>();
  const [futureOk, setFutureOk] = useState<number>();
  /** The stage (m) the user said is right after the slip question. */
  const [slipOk, setSlipOk] = useState<number>();
  /** Which instant the user picked for a time the clocks skipped or repeated (kept while the text is the same). */
  const [timeChoice, setTimeChoice] = useState<{ text: string; time_ms: number }>();
  /** Photos chosen for a new reading, kept once it is saved (a photo that does not fit never stops the reading). */
  const [photos, setPhotos] = useState<PendingPhoto[]>([]);
  const draft = useKeptDraft(form, ready, {
    form: 'reading', siteId: site.id, hasContent, toFields: toDraftFields,
    onError: (err) => setError({ text: `The draft could not be kept: ${plainError(err, { units: u, timeZone: site.timeZone })}` }),
  });
  const stageInput = useRef<HTMLInputElement>(null);
  const noteInput = useRef<HTMLTextAreaElement>(null);
  const { now, tick } = useClock();

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
      // Following the clock, "previous" is the latest reading up to this moment, so one saved seconds ago counts.
      const before = 'followsClock' in time && time.followsClock ? Date.now() + 1 : t;
      const [ratings, previous] = await Promise.all([listRatings(site.id), readingBefore(site.id, before, readingId)]);
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
    // A stage far outside what the site has seen is a slip until the user says otherwise (DOMAIN.md §1).
    if (check.slip && slipOk !== stage.stage_m) {
      setError({ field: 'slip', text: check.slip });
      return;
    }
    setSaving(true);
    setError(undefined);
    try {
      // A reading following the clock is stamped with the instant of Save (DOMAIN.md §1), and checked again
      // there, so readings saved within one minute keep their order and "previous" is the one just before.
      const instant = Date.now();
      const followsClock = 'followsClock' in time && time.followsClock;
      const at = followsClock ? instant : t;
      const checked = followsClock && context.state === 'ready' && context.value
        ? await (async () => {
          const previous = await readingBefore(site.id, at, readingId);
          return checkReading({
            stage_m: stage.stage_m, time_ms: at, now_ms: instant, jumpLimit_m: site.jumpLimit_m, units: u, ratings: context.value!.ratings,
            previous: previous && { stage_m: previous.stage_m, time_ms: previous.time_ms },
          });
        })()
        : check;
      await draft.flush(); // the draft stays until the reading itself is stored, in the same transaction
      draft.pause(true);
      const record = await saveReading(
        {
          ...(form.editing && { id: form.editing.id }),
          siteId: site.id, time_ms: at, stage_m: stage.stage_m, source: form.source, quality: form.quality,
          observer: form.observer.trim(), note: form.note.trim(), warnings: checked.warnings.map((w) => w.text),
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
      const q = !hasDischarge(checked.discharge_m3s) ? 'no discharge (no rating)' : formatQuantity('discharge', checked.discharge_m3s, u) + (checked.extrapolated ? ', extrapolated' : '');
      const photoWords = form.editing ? '' : await keepPending(photos, site.id, { kind: 'reading', id: record.id });
      if (!form.editing) setPhotos([]);
      const text = `Saved: ${formatQuantity('stage', record.stage_m, u)} at ${formatTime(record.time_ms, site.timeZone)}, ${q}.${photoWords}`;
      setRestoredAt(undefined);
      setFutureOk(undefined);
      setSlipOk(undefined);
      tick();
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
      setError({ text: plainError(err, { doing: 'save', units: u, timeZone: site.timeZone }) });
    }
  }

  if (!ready) return <p aria-busy="true">Opening the form…</p>;
  const stageError = 'error' in stage ? stage.error : error?.field === 'stage' ? error.text : undefined;
  const timeError = 'error' in time ? time.error : error?.field === 'time' ? error.text : undefined;
  const barMessage: BarMessage | undefined =
    !error || error.field === 'stage' || error.field === 'time' || error.field === 'logger-value'
      ? undefined
      : error.field === 'future' && t !== undefined
        ? { text: error.text, answer: { label: 'Keep this time', onAnswer: () => setFutureOk(t) } }
        : error.field === 'slip' && 'stage_m' in stage
          ? { text: error.text, answer: { label: 'Keep this stage', onAnswer: () => { setSlipOk(stage.stage_m); setError(undefined); } } }
          : { text: error.text };
  /** A field's error goes as soon as the field is edited; the check runs again on Save. */
  const clearFor = (...fields: string[]) => {
    if (error?.field !== undefined && fields.includes(error.field)) setError(undefined);
  };
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
      <StageField inputRef={stageInput} text={form.stageText} units={u} error={stageError} check={check}
        onText={(text) => {
          clearFor('stage', 'slip');
          dispatch({ type: 'set', field: 'stageText', value: text });
        }}
        onAddNote={() => noteInput.current?.focus()} />
      <TimeField time={time} timeText={form.timeText} timeZone={site.timeZone} now={now} error={timeError}
        onText={(text) => {
          clearFor('time', 'future');
          dispatch({ type: 'set', field: 'timeText', value: text });
        }}
        onChoose={(time_ms) => {
          setTimeChoice({ text: form.timeText, time_ms });
          clearFor('time');
        }} />
      <SourceQuality source={form.source} quality={form.quality}
        onSource={(value) => dispatch({ type: 'source', value })} onQuality={(value) => dispatch({ type: 'quality', value })} />
      <LoggerCheck value={form.loggerCheckText} stage_m={'stage_m' in stage ? stage.stage_m : undefined} units={u}
        error={error?.field === 'logger-value' ? error.text : undefined} onChange={(value) => {
          clearFor('logger-value');
          dispatch({ type: 'loggerCheck', value });
        }} />
      <ObserverNote observer={form.observer} note={form.note} jump={jump} noteRef={noteInput}
        onObserver={(value) => dispatch({ type: 'set', field: 'observer', value })} onNote={(value) => dispatch({ type: 'set', field: 'note', value })} />
      {form.editing
        ? <Photos siteId={site.id} owner={{ kind: 'reading', id: form.editing.id }} timeZone={site.timeZone} />
        : <PendingPhotos value={photos} onChange={setPhotos} timeZone={site.timeZone} />}
      <LocationField value={form.gps} onChange={(value) => dispatch({ type: 'gps', value })} />
      <p><a href={href('sites', site.id)}>Readings of this site</a></p>
      <Cautions compact />
      <SaveBar saved={saved} onUndo={(id) => void undoSave(id)} message={barMessage} check={check} units={u} saving={saving} editing={!!form.editing} />
    </form>
  );
}
