// The reading form's state (web/screens/Record/form.ts): the reducer, drafts as JSON, and what an edit
// means. A field the user did not change keeps its stored value exactly; the cases are the faults seen
// in the field (a rounded stage, a US-units site, seconds dropped, the repeated hour at the autumn clock
// change in Pacific/Auckland, which by the IANA tz database ends daylight time at 03:00 on 5 April 2026).
import { describe, expect, it } from 'vitest';
import { fromLocalInput, toLocalInput, type ReadingRecord } from '../../core';
import {
  blankForm, formOfReading, formReducer, fromDraftFields, hasContent, stageOf, timeOf, toDraftFields,
} from '../../web/screens/Record/form';

const ZONE = 'Pacific/Auckland';
const stored = (over: Partial<ReadingRecord>): ReadingRecord => ({
  id: '0b6f1f3e-6a53-4f7c-9a53-1d2f6e1b7c10', rev: '0001780000000000-000000-dev', updated_ms: 0, siteId: 's',
  time_ms: Date.UTC(2026, 2, 1, 2, 12, 47), stage_m: 0.3456, source: 'staff', quality: 'good', observer: 'R. Tane', note: '',
  warnings: [], ...over,
});

describe('an edit keeps what the user did not change', () => {
  it('keeps the stored stage and time exactly when only the note changes', () => {
    const r = stored({});
    const form = formReducer(formOfReading(r, '0.346', toLocalInput(r.time_ms, ZONE)), { type: 'set', field: 'note', value: 'weed cleared' });
    expect(stageOf(form, 'metric')).toEqual({ stage_m: 0.3456 }); // not 0.346
    expect(timeOf(form, ZONE, 0)).toEqual({ time_ms: r.time_ms, followsClock: false }); // seconds kept: 02:12:47
  });
  it('keeps a metre stage on a US-units site instead of going through 0.01 ft', () => {
    const r = stored({ stage_m: 0.7 });
    const form = formOfReading(r, '2.30', toLocalInput(r.time_ms, ZONE));
    // 2.30 ft is 0.70104 m (NIST SP 811: 1 ft = 0.3048 m exactly); the stored 0.7 m must stay.
    expect(stageOf(form, 'us')).toEqual({ stage_m: 0.7 });
    expect(stageOf(formReducer(form, { type: 'set', field: 'stageText', value: '2.31' }), 'us')).toEqual({ stage_m: 2.31 * 0.3048 });
  });
  it('keeps a reading in the repeated hour of the autumn change at its own instant', () => {
    // 02:30 NZST (+12:00) on 5 April 2026 is the second 02:30 that night; the first was 02:30 NZDT (+13:00).
    const second = Date.UTC(2026, 3, 4, 14, 30);
    const text = toLocalInput(second, ZONE);
    expect(text).toBe('2026-04-05T02:30');
    expect(fromLocalInput(text, ZONE)).toBe(second - 3_600_000); // the text alone names the earlier instant
    expect(timeOf(formOfReading(stored({ time_ms: second }), '0.346', text), ZONE, 0)).toEqual({ time_ms: second, followsClock: false });
  });
  it('reads a changed time as typed, and an empty time as the clock to the second', () => {
    const r = stored({});
    const changed = formReducer(formOfReading(r, '0.346', toLocalInput(r.time_ms, ZONE)), { type: 'set', field: 'timeText', value: '2026-03-01T16:00' });
    expect(timeOf(changed, ZONE, 0)).toEqual({ time_ms: Date.UTC(2026, 2, 1, 3, 0), followsClock: false }); // NZDT is UTC+13
    expect(timeOf(blankForm(''), ZONE, 1_234_567)).toEqual({ time_ms: 1_234_000, followsClock: true });
  });
  it('refuses a stage that is not a number, and says what is expected', () => {
    const f = formReducer(blankForm(''), { type: 'set', field: 'stageText', value: 'abc' });
    expect(stageOf(f, 'metric')).toEqual({ error: 'Type the stage as a number, like 0.734.' });
    expect(stageOf(blankForm(''), 'metric')).toEqual({ empty: true });
    expect(stageOf(formReducer(blankForm(''), { type: 'set', field: 'stageText', value: '0,52' }), 'metric')).toEqual({ stage_m: 0.52 });
  });
});

describe('the reducer and drafts', () => {
  it('after a save keeps who, how and from where, and clears what was read', () => {
    let f = blankForm('R. Tane');
    f = formReducer(f, { type: 'source', value: 'wire-weight' });
    f = formReducer(f, { type: 'quality', value: 'poor' });
    f = formReducer(f, { type: 'set', field: 'stageText', value: '0.5' });
    f = formReducer(f, { type: 'set', field: 'note', value: 'ice' });
    expect(formReducer(f, { type: 'saved' })).toEqual({ ...blankForm('R. Tane'), source: 'wire-weight', quality: 'good' });
  });
  it('round-trips a form, an edit included, through draft fields', () => {
    const edit = formReducer(formOfReading(stored({}), '0.346', '2026-03-01T15:12'), { type: 'gps', value: { lat: -41.2, lon: 174.7, accuracy_m: 6, time_ms: 5 } });
    const back = fromDraftFields(JSON.parse(JSON.stringify(toDraftFields(edit))), 'someone');
    expect(back).toEqual(edit);
    expect(stageOf(back, 'metric')).toEqual({ stage_m: 0.3456 });
  });
  it('falls back to the blank value for each malformed draft field', () => {
    const f = fromDraftFields({ stageText: 3, source: 'telepathy', quality: null, gps: { lat: 'x' }, editing: { id: 1 } }, 'R. Tane');
    expect(f).toEqual(blankForm('R. Tane'));
    expect(hasContent(f)).toBe(false);
    expect(hasContent(formReducer(f, { type: 'set', field: 'note', value: ' x ' }))).toBe(true);
  });
});
