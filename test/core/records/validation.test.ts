// Record validation: a bad field is refused with a RecordValidationError (a RangeError) that names it.
import { describe, expect, it } from 'vitest';
import {
  fromSyncRecord, RecordValidationError, toSyncRecord, validateAnalysisBody, validateBody, validateGaugingBody,
  validateRatingBody, validateReadingBody, validateRecord, validateSiteBody, validateSyncRecord, type ReadingRecord,
} from '../../../core/records/index';
import { gauging, rating, reading, site } from '../../support/records';

const SITE_ID = '0b6f1f3e-6a53-4f7c-9a53-1d2f6e1b7c10';

function fieldOf(fn: () => void): string {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(RecordValidationError);
    expect(e).toBeInstanceOf(RangeError);
    return (e as RecordValidationError).field;
  }
  throw new Error('expected a RecordValidationError');
}

describe('record validation', () => {
  it('accepts the invented records', () => {
    expect(() => validateSiteBody(site())).not.toThrow();
    expect(() => validateReadingBody(reading(SITE_ID, 1_767_225_600_000, 0.734))).not.toThrow();
    expect(() => validateGaugingBody(gauging(SITE_ID, 1_767_225_600_000))).not.toThrow();
    expect(() => validateRatingBody(rating(SITE_ID, 0))).not.toThrow();
  });

  // Each row: a broken record and the field the refusal must name (exact: the field we broke).
  const cases: [string, () => void, string][] = [
    ['stage NaN', () => validateReadingBody(reading(SITE_ID, 0, Number.NaN)), 'stage_m'],
    ['stage as text', () => validateReadingBody({ ...reading(SITE_ID, 0, 1), stage_m: '0.7' }), 'stage_m'],
    ['fractional time', () => validateReadingBody(reading(SITE_ID, 1.5, 1)), 'time_ms'],
    ['unknown source', () => validateReadingBody({ ...reading(SITE_ID, 0, 1), source: 'radar' }), 'source'],
    ['unknown quality', () => validateReadingBody({ ...reading(SITE_ID, 0, 1), quality: 'great' }), 'quality'],
    ['missing site', () => validateReadingBody({ ...reading(SITE_ID, 0, 1), siteId: '' }), 'siteId'],
    ['warnings not a list', () => validateReadingBody({ ...reading(SITE_ID, 0, 1), warnings: 'jump' }), 'warnings'],
    ['gps latitude 91°', () => validateReadingBody(reading(SITE_ID, 0, 1, { gps: { lat: 91, lon: 0, accuracy_m: 5, time_ms: 0 } })), 'gps.lat'],
    ['gps negative accuracy', () => validateReadingBody(reading(SITE_ID, 0, 1, { gps: { lat: 1, lon: 0, accuracy_m: -1, time_ms: 0 } })), 'gps.accuracy_m'],
    ['site zone unknown', () => validateSiteBody(site({ timeZone: 'Mars/Olympus' })), 'timeZone'],
    ['site jump limit 0', () => validateSiteBody(site({ jumpLimit_m: 0 })), 'jumpLimit_m'],
    ['site units', () => validateSiteBody({ ...site(), displayUnits: 'imperial' }), 'displayUnits'],
    ['gauging negative Q', () => validateGaugingBody(gauging(SITE_ID, 0, { discharge_m3s: -1 })), 'discharge_m3s'],
    ['gauging vertical depth', () => validateGaugingBody(gauging(SITE_ID, 0, { verticals: [{ station_m: 0, depth_m: -0.1, velocity_mps: 0 }] })), 'verticals[0].depth_m'],
    ['rating exponent 0', () => validateRatingBody(rating(SITE_ID, 0, { segments: [{ fromStage_m: 0, coefficient: 1, offset_m: 0, exponent: 0 }] })), 'segments[0].exponent'],
    ['rating breakpoints not ascending', () => validateRatingBody(rating(SITE_ID, 0, {
      segments: [{ fromStage_m: 0.5, coefficient: 1, offset_m: 0, exponent: 2 }, { fromStage_m: 0.5, coefficient: 1, offset_m: 0, exponent: 2 }],
    })), 'segments[1].fromStage_m'],
    ['rating no segments', () => validateRatingBody(rating(SITE_ID, 0, { segments: [] })), 'segments'],
    ['shift points unsorted', () => validateRatingBody(rating(SITE_ID, 0, {
      shifts: [{ time_ms: 0, toNext: 'hold', curve: { points: [{ stage_m: 1, shift_m: 0 }, { stage_m: 0.5, shift_m: 0 }] } }],
    })), 'shifts[0].curve.points[1].stage_m'],
    ['analysis window backwards', () => validateAnalysisBody({
      siteId: SITE_ID, from_ms: 10, to_ms: 5, method: { kind: 'straight-line' },
      points: { riseStart_ms: 5, peak_ms: 6, inflection_ms: 7, runoffEnd_ms: 8 },
      results: { peak_m3s: 1, peakTime_ms: 6, totalVolume_m3: 1, baseflowVolume_m3: 0.5, directVolume_m3: 0.5, baseflowIndex: 0.5 }, note: '',
    }), 'to_ms'],
    ['draft fields with a function', () => validateBody('draft', { form: 'reading', fields: { f: () => 1 } }), 'fields.f'],
  ];
  it.each(cases)('refuses %s naming the field', (_name, fn, field) => {
    expect(fieldOf(fn)).toBe(field);
  });

  it('says what was wrong and what is needed', () => {
    expect(() => validateReadingBody(reading(SITE_ID, 0, Number.POSITIVE_INFINITY))).toThrow(
      'reading stage_m must be a finite number from -1000 to 1000 (m); got Infinity',
    );
  });

  it('checks the envelope of a stored record: UUID id, revision, tombstone flag', () => {
    const base = { ...reading(SITE_ID, 0, 1), id: SITE_ID, rev: '1767225600000-000000-dev', updated_ms: 1 };
    expect(() => validateRecord('reading', base)).not.toThrow();
    // RFC 9562: a UUID is 8-4-4-4-12 hexadecimal digits.
    expect(fieldOf(() => validateRecord('reading', { ...base, id: 'not-a-uuid' }))).toBe('id');
    expect(fieldOf(() => validateRecord('reading', { ...base, rev: '2026-03-01' }))).toBe('rev');
    expect(fieldOf(() => validateRecord('reading', { ...base, deleted: false }))).toBe('deleted');
  });

  it('converts a record to the sync shape and back unchanged, tombstones included', () => {
    const live: ReadingRecord = { ...reading(SITE_ID, 0, 1), id: SITE_ID, rev: '1767225600000-000003-dev', updated_ms: 5 };
    const sync = toSyncRecord('reading', live);
    expect(sync).toEqual({ kind: 'reading', id: SITE_ID, rev: live.rev, body: { ...reading(SITE_ID, 0, 1), updated_ms: 5 } });
    expect(() => validateSyncRecord(JSON.parse(JSON.stringify(sync)))).not.toThrow();
    expect(fromSyncRecord(sync)).toEqual(live);
    const dead: ReadingRecord = { ...live, deleted: true };
    expect(toSyncRecord('reading', dead).deleted).toBe(true);
    expect(fromSyncRecord(toSyncRecord('reading', dead))).toEqual(dead);
  });
});
