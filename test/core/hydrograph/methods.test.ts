import { describe, expect, it } from 'vitest';
import {
  BFI_MAX_PRESETS,
  defaultChapmanMaxwell,
  defaultEckhardt,
  defaultLyneHollick,
  defaultSmoothedMinima,
  methodWithDefaults,
  separateBaseflow,
  SEPARATION_FAMILY,
  SEPARATION_FAMILY_SENTENCES,
  SEPARATION_METHOD_KINDS,
  seriesFromReadings,
  usesKeyPoints,
  type SeparationMethodKind,
} from '../../../core/hydrograph/index';
import { READING_SOURCE_CODES } from '../../../core/records/index';

const H = 3_600_000;
const T0 = Date.UTC(2024, 2, 1);

describe('separation methods: one home for kinds, families, defaults and presets', () => {
  it('lists every kind once, grouped by family', () => {
    expect(new Set(SEPARATION_METHOD_KINDS).size).toBe(9);
    expect(Object.keys(SEPARATION_FAMILY).sort()).toEqual([...SEPARATION_METHOD_KINDS].sort());
    // the list keeps each family together
    const families = SEPARATION_METHOD_KINDS.map((k) => SEPARATION_FAMILY[k]);
    expect(families).toEqual([...families].sort((a, b) => families.indexOf(a) - families.indexOf(b)));
  });

  // DOMAIN.md §4: the event methods draw b(t) between the rise start A and the end of runoff C; the
  // continuous filters (Lyne–Hollick, Chapman–Maxwell, Eckhardt) and the minima methods need no key points.
  const keyPointKinds: SeparationMethodKind[] = ['constant-discharge', 'straight-line', 'concave', 'variable-slope'];
  for (const kind of SEPARATION_METHOD_KINDS) {
    it(`${kind} ${keyPointKinds.includes(kind) ? 'uses' : 'does not use'} key points`, () => {
      expect(usesKeyPoints(kind)).toBe(keyPointKinds.includes(kind));
    });
  }

  it('each family has one plain sentence', () => {
    for (const sentence of Object.values(SEPARATION_FAMILY_SENTENCES)) {
      expect(sentence).toMatch(/^[A-Z][^.]*\.$/);
      expect(sentence).not.toMatch(/[a-z]+[A-Z]|_/); // no internal names
    }
  });

  it('Eckhardt BFImax presets are the typical values of Eckhardt 2005', () => {
    // Eckhardt 2005, Hydrological Processes 19, 507–515: 0.80 perennial/porous, 0.50 ephemeral/porous,
    // 0.25 perennial/hard rock (DOMAIN.md §4).
    expect(BFI_MAX_PRESETS).toEqual({ 'perennial-porous': 0.8, 'ephemeral-porous': 0.5, 'perennial-hard-rock': 0.25 });
    expect(defaultEckhardt).toEqual({ recession: 0.98, bfiMax: 0.8 }); // a ≈ 0.98 for daily data (DOMAIN.md §4)
    expect(defaultLyneHollick).toEqual({ alpha: 0.925, passes: 3, reflect: 30 }); // Nathan & McMahon 1990; Ladson et al. 2013
    expect(defaultChapmanMaxwell).toEqual({ recession: 0.925 }); // common practice
    expect(defaultSmoothedMinima).toEqual({ block_days: 5, factor: 0.9 }); // Gustard et al. 1992, IH Report 108
  });

  it('methodWithDefaults writes every parameter out from the defaults', () => {
    expect(methodWithDefaults('lyne-hollick')).toEqual({ kind: 'lyne-hollick', alpha: 0.925, passes: 3 });
    expect(methodWithDefaults('eckhardt', { bfiPreset: 'perennial-hard-rock' })).toEqual({ kind: 'eckhardt', bfiMax: 0.25, recession: 0.98 });
    expect(methodWithDefaults('eckhardt')).toEqual({ kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 });
    expect(methodWithDefaults('chapman-maxwell')).toEqual({ kind: 'chapman-maxwell', recession: 0.925 });
    expect(methodWithDefaults('smoothed-minima')).toEqual({ kind: 'smoothed-minima', block_days: 5, factor: 0.9 });
    expect(methodWithDefaults('concave')).toEqual({ kind: 'concave' });
    // Sloto & Crouse 1996: 2N* for 100 km² is the odd integer nearest 2·0.827·100^0.2 = 4.16 → 5 days
    expect(methodWithDefaults('local-minimum', { area_km2: 100 })).toEqual({ kind: 'local-minimum', interval_days: 5 });
    expect(methodWithDefaults('local-minimum')).toEqual({ kind: 'local-minimum' });
    expect(() => methodWithDefaults('eckhardt', { bfiPreset: 'sandstone' as never })).toThrow(/known aquifer type; got sandstone/);
  });

  it('separateBaseflow reads the same defaults: an open Lyne–Hollick equals the written-out one', () => {
    const n = 200;
    const time_ms = Float64Array.from({ length: n }, (_, i) => T0 + i * H);
    const discharge_m3s = Float64Array.from({ length: n }, (_, i) => 2 + 10 * Math.exp(-(((i - 60) / 12) ** 2)));
    const s = { time_ms, discharge_m3s };
    const open = separateBaseflow(s, { kind: 'lyne-hollick' });
    const written = separateBaseflow(s, methodWithDefaults('lyne-hollick'));
    const other = separateBaseflow(s, { kind: 'lyne-hollick', alpha: 0.95 });
    expect(Array.from(open)).toEqual(Array.from(written));
    expect(Array.from(open)).not.toEqual(Array.from(other)); // the comparison can fail
  });
});

describe('seriesFromReadings: one discharge per time, the logger wins, manual readings averaged', () => {
  const { logger, staff } = READING_SOURCE_CODES;
  const wire = READING_SOURCE_CODES['wire-weight'];
  const rows = (t: number[], q: number[], source: number[], extrapolated = t.map(() => 0)) => ({
    time_ms: Float64Array.from(t),
    discharge_m3s: Float64Array.from(q),
    source: Uint8Array.from(source),
    extrapolated: Uint8Array.from(extrapolated),
  });

  it('worked by hand: logger beats staff at the same time; two loggers averaged; two manual readings averaged', () => {
    const r = seriesFromReadings(
      rows(
        [0, H, H, 2 * H, 2 * H, 2 * H, 3 * H, 3 * H],
        [1.0, 2.0, 2.4, 3.0, 3.2, 9.9, 4.0, 5.0],
        [logger, staff, logger, logger, logger, staff, staff, wire],
        [0, 1, 0, 1, 0, 1, 0, 1],
      ),
    );
    expect(r.kind).toBe('ready');
    if (r.kind !== 'ready') return;
    expect(Array.from(r.series.time_ms)).toEqual([0, H, 2 * H, 3 * H]);
    // by hand: 1.0; logger 2.4 (staff 2.0 left out); loggers (3.0 + 3.2)/2 = 3.1 (staff 9.9 left out); (4 + 5)/2 = 4.5
    expect(r.series.discharge_m3s[0]).toBe(1.0);
    expect(r.series.discharge_m3s[1]).toBe(2.4);
    expect(r.series.discharge_m3s[2]).toBeCloseTo(3.1, 14);
    expect(r.series.discharge_m3s[3]).toBe(4.5);
    expect(r.skipped).toBe(2);
    // extrapolated readings among those used: the logger at 2 h (index 3) and the wire-weight at 3 h (index 7)
    expect(r.extrapolated).toBe(2);
  });

  it('an empty window and a window with readings without a rating say so', () => {
    expect(seriesFromReadings(rows([], [], []))).toEqual({ kind: 'empty' });
    expect(seriesFromReadings(rows([0, H, 2 * H], [1, NaN, NaN], [logger, logger, staff]))).toEqual({
      kind: 'unrated',
      count: 2,
      total: 3,
      firstTime_ms: H,
    });
  });
});
