// The reading form's state and its typed actions: the screen owns this draft through useReducer.
import { isReadingQuality, isReadingSource, type GpsFix, type JsonValue, type ReadingQuality, type ReadingRecord, type ReadingSource } from '../../../core';

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
  /** Set when editing a stored reading. */
  readingId?: string;
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

/** The form of a stored reading being edited (stage and time shown as typed values). */
export function formOfReading(r: ReadingRecord, stageText: string, timeText: string, loggerCheckText?: string): ReadingForm {
  return {
    stageText, timeText, source: r.source, quality: r.quality, observer: r.observer, note: r.note, gps: r.gps, readingId: r.id,
    ...(loggerCheckText !== undefined && { loggerCheckText }),
  };
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
  if (form.readingId) fields.readingId = form.readingId;
  if (form.loggerCheckText !== undefined) fields.loggerCheckText = form.loggerCheckText;
  return fields;
}

/** A form restored from draft fields; anything malformed falls back to the blank form's value. */
export function fromDraftFields(fields: { [key: string]: JsonValue }, observer: string): ReadingForm {
  const text = (k: string, d: string) => (typeof fields[k] === 'string' ? (fields[k] as string) : d);
  const base = blankForm(observer);
  const gps = fields.gps as unknown as GpsFix | undefined;
  const gpsOk = !!gps && typeof gps === 'object' && [gps.lat, gps.lon, gps.accuracy_m, gps.time_ms].every((v) => typeof v === 'number' && Number.isFinite(v));
  return {
    stageText: text('stageText', ''),
    timeText: text('timeText', ''),
    source: isReadingSource(fields.source) ? fields.source : base.source,
    quality: isReadingQuality(fields.quality) ? fields.quality : base.quality,
    observer: text('observer', observer),
    note: text('note', ''),
    ...(gpsOk && { gps: { lat: gps.lat, lon: gps.lon, accuracy_m: gps.accuracy_m, time_ms: gps.time_ms } }),
    ...(typeof fields.readingId === 'string' && { readingId: fields.readingId }),
    ...(typeof fields.loggerCheckText === 'string' && { loggerCheckText: fields.loggerCheckText }),
  };
}

/** Whether the form holds anything worth keeping as a draft. */
export function hasContent(form: ReadingForm): boolean {
  return form.stageText.trim() !== '' || form.note.trim() !== '' || form.timeText !== '' || !!form.gps || !!form.loggerCheckText?.trim();
}
