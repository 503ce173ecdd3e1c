// Invented record bodies for tests (Kettle Creek at Fernbrook, an invented site): pure, no storage.
import type { GaugingBody, RatingBody, ReadingBody, SiteBody } from '../../core/records/index';

/** 2026-03-01T00:00:00Z, UTC ms: the invented start of the test data. */
export const T0 = Date.UTC(2026, 2, 1);
/** 15 minutes in ms. */
export const QUARTER_HOUR_MS = 15 * 60 * 1000;

/** An invented site (Kettle Creek at Fernbrook). */
export function site(overrides: Partial<SiteBody> = {}): SiteBody {
  return {
    code: 'KC-01',
    name: 'Kettle Creek at Fernbrook',
    area_km2: 48.2,
    datum: { description: 'Arbitrary local datum, bench mark BM-3', elevation_m: 212.41 },
    location: { lat: -41.2875, lon: 174.7761 },
    timeZone: 'Pacific/Auckland',
    displayUnits: 'metric',
    jumpLimit_m: 0.3,
    ...overrides,
  };
}

/** An invented staff reading at `siteId`. */
export function reading(siteId: string, time_ms: number, stage_m: number, overrides: Partial<ReadingBody> = {}): ReadingBody {
  return { siteId, time_ms, stage_m, source: 'staff', quality: 'good', observer: 'R. Tane', note: '', warnings: [], ...overrides };
}

/** n invented logger readings every 15 minutes from start_ms. */
export function loggerSeries(siteId: string, start_ms: number, n: number): ReadingBody[] {
  const out: ReadingBody[] = [];
  for (let i = 0; i < n; i++) {
    out.push({
      siteId, time_ms: start_ms + i * QUARTER_HOUR_MS, stage_m: 0.5 + 0.2 * Math.sin(i / 50),
      source: 'logger', quality: 'good', observer: '', note: '', warnings: [],
    });
  }
  return out;
}

/** An invented gauging. */
export function gauging(siteId: string, time_ms: number, overrides: Partial<GaugingBody> = {}): GaugingBody {
  return {
    siteId, time_ms, meanStage_m: 0.734, discharge_m3s: 1.92, method: 'velocity-area', grade: 'good',
    observer: 'R. Tane', note: '', ...overrides,
  };
}

/** An invented one-segment rating Q = 10·(h − 0.2)², gauged from 0.3 to 1.5 m. */
export function rating(siteId: string, validFrom_ms: number, overrides: Partial<RatingBody> = {}): RatingBody {
  return {
    siteId, validFrom_ms,
    segments: [{ fromStage_m: 0.2, coefficient: 10, offset_m: 0.2, exponent: 2 }],
    gaugedRange_m: [0.3, 1.5], shifts: [], fittedFrom: [], note: '', ...overrides,
  };
}
