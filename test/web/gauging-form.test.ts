import { describe, expect, it } from 'vitest';
import { midSection, type RatingRecord, type GaugingRecord } from '../../core';
import { blankGaugingForm, gaugingReducer, type GaugingForm } from '../../web/screens/Gaugings/form';
import { fromDraftFields, toDraftFields } from '../../web/screens/Gaugings/form-draft';
import { parseGaugingForm } from '../../web/screens/Gaugings/read-gauging';
import { parseVertical, runningTotals } from '../../web/screens/Gaugings/read-vertical';
import { gaugingCheck } from '../../web/screens/Gaugings/check';

const ctx = { units: 'metric' as const, timeZone: 'UTC', now_ms: Date.UTC(2026, 5, 1, 12), siteId: 'site-1' };

function keep(form: GaugingForm, station: string, depth: string, v: string): GaugingForm {
  let f = gaugingReducer(form, { type: 'entryKind', value: 'six-tenths' });
  f = gaugingReducer(f, { type: 'entry', field: 'stationText', value: station });
  f = gaugingReducer(f, { type: 'entry', field: 'depthText', value: depth });
  f = gaugingReducer(f, { type: 'entry', field: 'v06Text', value: v });
  const p = parseVertical(f, 'metric');
  if (!p.ok) throw new Error(JSON.stringify(p.errors));
  return gaugingReducer(f, { type: 'keepVertical', vertical: p.vertical });
}

describe('gauging form', () => {
  // Turnipseed & Sauer 2010 (USGS TM 3-A8) mid-section rule, computed by hand here: q_i = v_i·d_i·(x_{i+1} − x_{i−1})/2
  it('totals 20 verticals as the mid-section rule does', () => {
    let f = blankGaugingForm('');
    const depths = Array.from({ length: 20 }, (_, i) => (i === 0 || i === 19 ? 0 : 0.2 + 0.03 * Math.min(i, 19 - i)));
    const vel = Array.from({ length: 20 }, (_, i) => (i === 0 || i === 19 ? 0 : 0.15 + 0.02 * Math.min(i, 19 - i)));
    for (let i = 0; i < 20; i++) f = keep(f, (0.5 * i).toFixed(1), depths[i].toFixed(3), vel[i].toFixed(3));
    const totals = runningTotals(f.verticals)!;
    let byHand = 0;
    for (let i = 1; i < 19; i++) byHand += Number(vel[i].toFixed(3)) * Number(depths[i].toFixed(3)) * 0.5;
    expect(totals.discharge_m3s).toBeCloseTo(byHand, 12);
    expect(totals.warnings.some((w) => /verticals/.test(w))).toBe(false);
    const p = parseGaugingForm(gaugingReducer(f, { type: 'set', field: 'stageText', value: '0.734' }), ctx);
    if (!p.ok) throw new Error(JSON.stringify(p.errors));
    expect(p.body.discharge_m3s).toBe(midSection(p.body.verticals!).discharge_m3s);
    expect(p.body.meanStage_m).toBe(0.734);
  });
  // USGS TWRI 3-A8 (Buchanan & Somers 1969): mean of 0.2 and 0.8 depth velocities; angle coefficient multiplies
  it('reads two-point velocities, corrects and removes a vertical', () => {
    let f = keep(keep(blankGaugingForm(''), '0', '0', '0'), '1', '0.5', '0.4');
    f = gaugingReducer(f, { type: 'entryKind', value: 'two-point' });
    f = gaugingReducer(f, { type: 'entry', field: 'stationText', value: '2' });
    f = gaugingReducer(f, { type: 'entry', field: 'depthText', value: '0.9' });
    f = gaugingReducer(f, { type: 'entry', field: 'v02Text', value: '0.6' });
    f = gaugingReducer(f, { type: 'entry', field: 'v08Text', value: '0.4' });
    f = gaugingReducer(f, { type: 'entry', field: 'angleText', value: '0.9' });
    const p = parseVertical(f, 'metric');
    if (!p.ok) throw new Error(JSON.stringify(p.errors));
    f = gaugingReducer(f, { type: 'keepVertical', vertical: p.vertical });
    f = keep(f, '3', '0', '0');
    expect(runningTotals(f.verticals)!.discharge_m3s).toBeCloseTo(0.4 * 0.5 * 1 + 0.5 * 0.9 * 0.9 * 1, 12);
    f = gaugingReducer(f, { type: 'editVertical', index: 1, units: 'metric' });
    expect(f.entry.depthText).toBe('0.5');
    f = gaugingReducer(f, { type: 'entry', field: 'v06Text', value: '0.8' });
    const fix = parseVertical(f, 'metric');
    if (!fix.ok) throw new Error('refused');
    f = gaugingReducer(f, { type: 'keepVertical', vertical: fix.vertical });
    expect(f.verticals[1].velocity).toEqual({ kind: 'six-tenths', v06_mps: 0.8 });
    f = gaugingReducer(f, { type: 'removeVertical', index: 2 });
    expect(f.verticals.map((v) => v.station_m)).toEqual([0, 1, 3]);
    // a draft round trip keeps every vertical
    expect(fromDraftFields(toDraftFields(f), '').form).toEqual(f);
  });
  it('refuses a station out of order, a negative depth, an angle above 1 and a summary without discharge, naming fields', () => {
    let f = keep(keep(blankGaugingForm(''), '0', '0', '0'), '1', '0.5', '0.4');
    f = gaugingReducer(f, { type: 'entry', field: 'stationText', value: '0.5' });
    f = gaugingReducer(f, { type: 'entry', field: 'depthText', value: '-1' });
    f = gaugingReducer(f, { type: 'entry', field: 'v06Text', value: 'fast' });
    f = gaugingReducer(f, { type: 'entry', field: 'angleText', value: '1.2' });
    const p = parseVertical(f, 'metric');
    expect(p.ok ? [] : p.errors.map((e) => e.field).sort()).toEqual(['v06', 'vAngle', 'vDepth', 'vStation']);
    const s = parseGaugingForm({ ...blankGaugingForm(''), mode: 'summary', stageText: '0.5', timeText: '2026-07-01T00:00' }, ctx);
    expect(s.ok ? [] : s.errors.map((e) => e.field).sort()).toEqual(['gDischarge', 'gTime']);
  });
  // common practice grades (USGS quality codes): good = within 5 %
  it('checks a gauging against the rating: deviation, within grade, implied shift', () => {
    const rating = { id: 'r', rev: '', updated_ms: 0, siteId: 's', validFrom_ms: 0, segments: [{ fromStage_m: 0.1, offset_m: 0.1, coefficient: 5, exponent: 2 }], shifts: [], fittedFrom: [], note: '' } as RatingRecord;
    const g = { meanStage_m: 0.5, discharge_m3s: 0.8 * 0.97, grade: 'good', time_ms: 1 } as GaugingRecord;
    const c = gaugingCheck(g, [rating])!;
    expect(c.deviation_pct).toBeCloseTo(-3, 10);
    expect(c.checks).toBe(true);
    // exact: s = e + (Q/C)^(1/b) − h
    expect(c.impliedShift_m).toBeCloseTo(0.1 + Math.sqrt(0.776 / 5) - 0.5, 12);
    expect(gaugingCheck({ ...g, grade: 'excellent' }, [rating])!.checks).toBe(false);
  });
});
