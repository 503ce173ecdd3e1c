// Reopening a saved gauging and typing verticals fast. References: the mid-section rule worked by hand
// (Turnipseed & Sauer 2010, USGS TM 3-A8); the mean of 0.2 and 0.8 depth velocities (Buchanan & Somers
// 1969, USGS TWRI 3-A8); regular spacing continued by arithmetic (last station + last spacing).
import { describe, expect, it } from 'vitest';
import { midSection, type GaugingRecord } from '../../core';
import { blankGaugingForm, enterOrder, formOfGauging, gaugingReducer, offeredStation, type GaugingForm } from '../../web/screens/Gaugings/form';
import { fromDraftFields, toDraftFields } from '../../web/screens/Gaugings/form-draft';
import { parseGaugingForm } from '../../web/screens/Gaugings/read-gauging';
import { parseVertical } from '../../web/screens/Gaugings/read-vertical';

const ctx = { units: 'metric' as const, timeZone: 'Europe/London', now_ms: Date.UTC(2026, 11, 2, 15), siteId: 'site-1' };

function keep(form: GaugingForm, station: string, depth: string, v: string): GaugingForm {
  let f = gaugingReducer(form, { type: 'entry', field: 'stationText', value: station });
  f = gaugingReducer(f, { type: 'entry', field: 'depthText', value: depth });
  f = gaugingReducer(f, { type: 'entry', field: 'v06Text', value: v });
  const p = parseVertical(f, 'metric');
  if (!p.ok) throw new Error(JSON.stringify(p.errors));
  return gaugingReducer(f, { type: 'keepVertical', vertical: p.vertical });
}

// Invented saved gauging: two edges and two verticals, one by 0.2 and 0.8 depth, seconds in its time.
const saved: GaugingRecord = {
  id: 'd1000000-0000-4000-8000-000000000001', rev: '0001764687600000-000000-devA', updated_ms: 0, siteId: 'site-1',
  time_ms: Date.UTC(2026, 11, 2, 9, 41, 27), meanStage_m: 0.412, discharge_m3s: 0.605, method: 'velocity-area', grade: 'fair', observer: 'K. Rain', note: 'weed on the control',
  verticals: [
    { station_m: 0, depth_m: 0, velocity_mps: 0, angleCoefficient: 1, observed: { kind: 'six-tenths', v06_mps: 0 } },
    { station_m: 1, depth_m: 0.5, velocity_mps: 0.4, angleCoefficient: 1 },
    { station_m: 2, depth_m: 0.9, velocity_mps: 0.5, angleCoefficient: 0.9, observed: { kind: 'two-point', v02_mps: 0.6, v08_mps: 0.4 } },
    { station_m: 3, depth_m: 0, velocity_mps: 0, angleCoefficient: 1, observed: { kind: 'six-tenths', v06_mps: 0 } },
  ],
};

describe('the next station offered from the last spacing', () => {
  it('continues a regular spacing either way across the section, and offers nothing before two or while correcting', () => {
    let f = blankGaugingForm('');
    expect(offeredStation(f, 'metric')).toBeUndefined();
    f = keep(f, '0.5', '0', '0');
    expect(offeredStation(f, 'metric')).toBeUndefined();
    f = keep(f, '0.9', '0.2', '0.1');
    // 0.9 + (0.9 − 0.5) = 1.3, without binary noise (1.3000000000000003).
    expect(offeredStation(f, 'metric')).toBe('1.3');
    f = keep(f, '1.3', '0.3', '0.2');
    expect(offeredStation(f, 'metric')).toBe('1.7');
    // From the right bank leftwards: 10, 9.25 → 8.5.
    const back = keep(keep(blankGaugingForm(''), '10', '0', '0'), '9.25', '0.3', '0.2');
    expect(offeredStation(back, 'metric')).toBe('8.5');
    expect(offeredStation(gaugingReducer(f, { type: 'editVertical', index: 1, units: 'metric' }), 'metric')).toBeUndefined();
  });
  it('in feet for a US site: 0.3048 m steps read as 1 ft steps (NIST SP 811)', () => {
    let f = blankGaugingForm('');
    f = gaugingReducer(f, { type: 'keepVertical', vertical: { station_m: 0, depth_m: 0, velocity: { kind: 'six-tenths', v06_mps: 0 }, angleCoefficient: 1 } });
    f = gaugingReducer(f, { type: 'keepVertical', vertical: { station_m: 0.3048, depth_m: 0.3, velocity: { kind: 'six-tenths', v06_mps: 0.2 }, angleCoefficient: 1 } });
    expect(offeredStation(f, 'us')).toBe('2');
  });
  it('Enter moves through station, depth and the velocities of the method, in order', () => {
    expect(enterOrder('six-tenths')).toEqual(['vStation', 'vDepth', 'v06']);
    expect(enterOrder('two-point')).toEqual(['vStation', 'vDepth', 'v02', 'v08']);
    expect(enterOrder('three-point')).toEqual(['vStation', 'vDepth', 'v02', 'v06', 'v08']);
  });
  it('carries the method and angle coefficient over to the next vertical', () => {
    let f = keep(blankGaugingForm(''), '0', '0', '0');
    f = gaugingReducer(f, { type: 'entry', field: 'angleText', value: '0.95' });
    f = keep(f, '1', '0.4', '0.3');
    expect(f.entry.angleText).toBe('0.95');
    expect(f.entry.stationText).toBe('');
  });
});

describe('correcting a saved gauging', () => {
  it('opens with every vertical, its point velocities, and the figures as saved', () => {
    const f = formOfGauging(saved, ctx.timeZone, 'metric');
    expect(f.saved).toEqual({ id: saved.id, rev: saved.rev, time_ms: saved.time_ms });
    expect(f.mode).toBe('verticals');
    expect(f.timeText).toBe('2026-12-02T09:41'); // London is UTC+0 in December (IANA zone rules)
    expect(f.stageText).toBe('0.412');
    expect(f.grade).toBe('fair');
    expect(f.verticals[2].velocity).toEqual({ kind: 'two-point', v02_mps: 0.6, v08_mps: 0.4 });
    // A vertical saved without its point velocities comes back as its mean at 0.6 depth.
    expect(f.verticals[1].velocity).toEqual({ kind: 'six-tenths', v06_mps: 0.4 });
  });
  it('saves the same body back when nothing is changed (the saved seconds kept), and a corrected depth changes the total by hand', () => {
    const f = formOfGauging(saved, ctx.timeZone, 'metric');
    const same = parseGaugingForm(f, ctx);
    if (!same.ok) throw new Error(JSON.stringify(same.errors));
    expect(same.body.time_ms).toBe(saved.time_ms);
    // q = 0.4·0.5·1 + 0.5·0.9·0.9·1 = 0.605 m³/s by hand.
    expect(same.body.discharge_m3s).toBeCloseTo(0.605, 12);
    expect(same.body.verticals![2].observed).toEqual(saved.verticals![2].observed);
    let g = gaugingReducer(f, { type: 'editVertical', index: 1, units: 'metric' });
    g = gaugingReducer(g, { type: 'entry', field: 'depthText', value: '0.6' });
    const p = parseVertical(g, 'metric');
    if (!p.ok) throw new Error('refused');
    g = gaugingReducer(g, { type: 'keepVertical', vertical: p.vertical });
    const changed = parseGaugingForm(g, ctx);
    if (!changed.ok) throw new Error('refused');
    expect(changed.body.discharge_m3s).toBeCloseTo(0.4 * 0.6 + 0.405, 12);
    expect(changed.body.discharge_m3s).toBe(midSection(changed.body.verticals!).discharge_m3s);
    // A new minute typed replaces the time.
    const moved = parseGaugingForm(gaugingReducer(f, { type: 'set', field: 'timeText', value: '2026-12-02T09:45' }), ctx);
    expect(moved.ok && moved.body.time_ms).toBe(Date.UTC(2026, 11, 2, 9, 45));
  });
  it('keeps which gauging it corrects through a draft, and drops a malformed one', () => {
    const f = formOfGauging(saved, ctx.timeZone, 'metric');
    expect(fromDraftFields(toDraftFields(f), '').form).toEqual(f);
    const bad = { ...toDraftFields(f), saved: { id: 7 } };
    expect(fromDraftFields(bad, '').form.saved).toBeUndefined();
  });
});
