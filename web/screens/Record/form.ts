// The reading form's state and its typed actions: the screen owns this draft through useReducer.
import {
  displayUnit, fromDisplay, isReadingQuality, MAX_ABS_STAGE_M, readLocalInput, toDisplay, type WallTimeAnswer, isReadingSource, type GpsFix, type JsonValue, type ReadingQuality, type ReadingRecord,
  type ReadingSource, type UnitSystem,
} from '../../../core';
import { parseDecimal, spaceInsideNumber } from '../../format';
import { plainError } from '../../plain-words';

/** What the technician has typed so far. `timeText` is empty while the time follows the clock. */
export interface ReadingForm {
  stageText: string;
  timeText: string;
  source: ReadingSource;
  quality: ReadingQuality;
  observer: string;
  note: string;
  gps?: GpsFix;
  /** The logger's value typed beside a check reading (display units); absent when the reading is not a check. */
  loggerCheckText?: string;
  /** Set when editing a stored reading: the reading as stored when the form opened. */
  editing?: EditBase;
}

/** A stored reading as an edit form opened it: id, rev, the stored stage (m) and time (UTC ms), and the texts first shown for them. */
export interface EditBase {
  id: string;
  rev: string;
  stage_m: number;
  time_ms: number;
  stageText: string;
  timeText: string;
}

/** Changes to the form. */
export type FormAction =
  | { type: 'set'; field: 'stageText' | 'timeText' | 'observer' | 'note'; value: string }
  | { type: 'source'; value: ReadingSource }
  | { type: 'quality'; value: ReadingQuality }
  | { type: 'gps'; value: GpsFix | undefined }
  | { type: 'loggerCheck'; value: string | undefined }
  | { type: 'replace'; form: ReadingForm }
  | { type: 'saved' };

/** A fresh form: staff reading, good quality, the remembered observer, time following the clock. */
export function blankForm(observer: string): ReadingForm {
  return { stageText: '', timeText: '', source: 'staff', quality: 'good', observer, note: '' };
}

/** The form of a stored reading being edited, its stage and time shown as the texts given. */
export function formOfReading(r: ReadingRecord, stageText: string, timeText: string, loggerCheckText?: string): ReadingForm {
  return {
    stageText, timeText, source: r.source, quality: r.quality, observer: r.observer, note: r.note, gps: r.gps,
    ...(loggerCheckText !== undefined && { loggerCheckText }),
    editing: { id: r.id, rev: r.rev, stage_m: r.stage_m, time_ms: r.time_ms, stageText, timeText },
  };
}

/** What the stage field means: nothing yet, a stage in m, or why not. */
export type StageValue = { empty: true } | { stage_m: number } | { error: string };

/**
 * The stage (m) the form means. While an edit's stage text is as first shown, the stored stage exactly
 * (the text is rounded for display); otherwise the typed number in the site's units.
 */
export function stageOf(form: ReadingForm, units: UnitSystem): StageValue {
  if (form.editing && form.stageText === form.editing.stageText) return { stage_m: form.editing.stage_m };
  if (!form.stageText.trim()) return { empty: true };
  const v = parseDecimal(form.stageText);
  if (v === undefined) return { error: spaceInsideNumber(form.stageText) ?? `Type the stage as a number, like ${units === 'us' ? '2.41' : '0.734'}.` };
  const stage_m = fromDisplay('stage', v, units);
  // No gauge reads beyond the stored limit: refuse here, before an absurd discharge or jump is shown.
  if (Math.abs(stage_m) > MAX_ABS_STAGE_M) return { error: `The stage must be a number from ${stageLimitText(units)}; check the number.` };
  return { stage_m };
}

/** "−1,000 to 1,000 m" (or ft): the stage a reading may hold, in the site's units. */
export function stageLimitText(u: UnitSystem): string {
  const v = Number(toDisplay('stage', MAX_ABS_STAGE_M, u).toPrecision(6)).toLocaleString('en');
  return `−${v} to ${v} ${displayUnit('stage', u)}`;
}

/**
 * What the time field means: a time in UTC ms (following the clock when empty); for a wall time in a
 * skipped or repeated hour, the two instants it may mean (`ask`) and the one the user picked, if any; or why not.
 */
export type TimeValue =
  | { time_ms: number; followsClock: boolean; ask?: TwoInstants }
  | { ask: TwoInstants; followsClock: false }
  | { error: string };

/** A wall time that names two instants: a repeated hour or a skipped one (UTC ms, earlier first). */
export type TwoInstants = Exclude<WallTimeAnswer, { kind: 'one' }>;

/** The instant the user picked for a wall time that names two (the text it was picked for, UTC ms). */
export interface TimeChoiceMade {
  text: string;
  time_ms: number;
}

/**
 * The time (UTC ms) the form means. While an edit's time text is as first shown, the stored time exactly
 * (the text drops seconds, and a wall time in a repeated hour names two instants); an empty text
 * follows the clock now_ms (to the whole second); otherwise the typed wall time in the site's zone, where
 * a skipped or repeated hour is asked about, never shifted: `choice` is the user's answer for that text.
 */
export function timeOf(form: ReadingForm, timeZone: string, now_ms: number, choice?: TimeChoiceMade): TimeValue {
  if (form.editing && form.timeText === form.editing.timeText) return { time_ms: form.editing.time_ms, followsClock: false };
  if (!form.timeText) return { time_ms: Math.floor(now_ms / 1000) * 1000, followsClock: true };
  try {
    const answer = readLocalInput(form.timeText, timeZone);
    if (answer.kind === 'one') return { time_ms: answer.time_ms, followsClock: false };
    const picked = choice?.text === form.timeText && answer.candidates_ms.includes(choice.time_ms) ? choice.time_ms : undefined;
    return picked === undefined ? { ask: answer, followsClock: false } : { time_ms: picked, ask: answer, followsClock: false };
  } catch (err) {
    return { error: plainError(err, { timeZone }) };
  }
}

/** The reducer behind the reading form. */
export function formReducer(form: ReadingForm, action: FormAction): ReadingForm {
  switch (action.type) {
    case 'set':
      return { ...form, [action.field]: action.value };
    case 'source':
      return { ...form, source: action.value };
    case 'quality':
      return { ...form, quality: action.value };
    case 'gps':
      return { ...form, gps: action.value };
    case 'loggerCheck': {
      const { loggerCheckText: _old, ...rest } = form;
      return action.value === undefined ? rest : { ...rest, loggerCheckText: action.value };
    }
    case 'replace':
      return action.form;
    case 'saved':
      // Ready for the next reading at the same site: keep who, how and from where; clear what was read.
      return { ...blankForm(form.observer), source: form.source, quality: 'good' };
  }
}

/** The form as draft fields (JSON). */
export function toDraftFields(form: ReadingForm): { [key: string]: JsonValue } {
  const fields: { [key: string]: JsonValue } = {
    stageText: form.stageText, timeText: form.timeText, source: form.source, quality: form.quality,
    observer: form.observer, note: form.note,
  };
  if (form.gps) fields.gps = { ...form.gps };
  if (form.loggerCheckText !== undefined) fields.loggerCheckText = form.loggerCheckText;
  if (form.editing) {
    fields.readingId = form.editing.id;
    fields.editing = { ...form.editing };
  }
  return fields;
}

/** A form restored from draft fields; anything malformed falls back to the blank form's value. */
export function fromDraftFields(fields: { [key: string]: JsonValue }, observer: string): ReadingForm {
  const text = (k: string, d: string) => (typeof fields[k] === 'string' ? (fields[k] as string) : d);
  const base = blankForm(observer);
  const gps = fields.gps as unknown as GpsFix | undefined;
  const editing = editBaseOf(fields.editing);
  const gpsOk = !!gps && typeof gps === 'object' && [gps.lat, gps.lon, gps.accuracy_m, gps.time_ms].every((v) => typeof v === 'number' && Number.isFinite(v));
  return {
    stageText: text('stageText', ''),
    timeText: text('timeText', ''),
    source: isReadingSource(fields.source) ? fields.source : base.source,
    quality: isReadingQuality(fields.quality) ? fields.quality : base.quality,
    observer: text('observer', observer),
    note: text('note', ''),
    ...(gpsOk && { gps: { lat: gps.lat, lon: gps.lon, accuracy_m: gps.accuracy_m, time_ms: gps.time_ms } }),
    ...(typeof fields.loggerCheckText === 'string' && { loggerCheckText: fields.loggerCheckText }),
    ...(editing && { editing }),
  };
}

function editBaseOf(x: JsonValue | undefined): EditBase | undefined {
  if (typeof x !== 'object' || x === null || Array.isArray(x)) return undefined;
  const { id, rev, stage_m, time_ms, stageText, timeText } = x;
  if (typeof id !== 'string' || typeof rev !== 'string' || typeof stageText !== 'string' || typeof timeText !== 'string') return undefined;
  if (typeof stage_m !== 'number' || !Number.isFinite(stage_m) || typeof time_ms !== 'number' || !Number.isFinite(time_ms)) return undefined;
  return { id, rev, stage_m, time_ms, stageText, timeText };
}

/** Whether the form holds anything worth keeping as a draft. */
export function hasContent(form: ReadingForm): boolean {
  return form.stageText.trim() !== '' || form.note.trim() !== '' || form.timeText !== '' || !!form.gps || !!form.loggerCheckText?.trim();
}
