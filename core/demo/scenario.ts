// The invented demo scenario: one small upland gauge with three weeks of 15-minute logger readings,
// one clear storm, a dozen gaugings and a two-segment rating. Every name and number is invented and
// generated here from the model below; nothing is copied from a real record.
//
// The invented model
// - Site: "Pellow Burn at Lantern Bridge" (code PB-03), an upland catchment of 12.4 km².
// - Rating (true, used to make the data): a riffle section control from 0.12 m,
//   Q = 6.0·(h − 0.12)^2.2, and channel control from 0.55 m, Q = C₂·(h − 0.02)^1.7 with C₂ chosen so
//   the two meet at 0.55 m. Gauged range 0.24–1.42 m, so the storm peak is an extrapolation.
// - Flow over 21 days: a baseflow recession 0.19·0.985^t (t in days), a small shower on day 5
//   (peak 0.35 m³/s) and a storm on day 13.5 (peak 7.2 m³/s), each a gamma-shaped pulse
//   Q_p·(τ/τ_p)^n·e^{n(1 − τ/τ_p)} with τ_p = 6 h and 8 h and n = 3, plus a slow groundwater response
//   to the storm that raises the later baseflow.
// - Logger stage = the true rating inverted at that flow, plus ±2 mm of reading noise, to the mm.
// - Staff check readings every 3–4 days, 1–5 mm off the logger; gaugings spread over the
//   previous year with ±4 % measurement scatter.
import { continuousCoefficient, dischargeAt, stageAt, type Rating } from '../rating/index';
import type { GaugingBody, LoggerDayBody, RatingBody, ReadingBody, SiteBody } from '../records/index';
import { driftCorrections } from '../exchange/logger-drift';
import { loggerDayId, splitLoggerDays } from '../exchange/logger-days';
import { MS_PER_DAY } from '../time/day';

const STEP_MS = 15 * 60_000;

/** A demo record with its fixed id (so loading the scenario twice writes nothing new). */
export type DemoItem<B> = { id: string } & B;

/**
 * Everything the demo loads: one site, its rating, gaugings, staff check readings and the logger record
 * as per-day logger records (raw values with a slow invented drift, corrected from the checks by core's
 * driftCorrections), the way a real logger import stores it.
 */
export interface DemoScenario {
  site: DemoItem<SiteBody>;
  rating: DemoItem<RatingBody>;
  gaugings: DemoItem<GaugingBody>[];
  /** Staff check readings beside the logger (each with the logger's value at its time). */
  readings: DemoItem<ReadingBody>[];
  /** The logger record, one record per UTC day (ids from loggerDayId). */
  loggerDays: DemoItem<LoggerDayBody>[];
}

/** The invented logger drift (m): the logger reads low by up to 6 mm over the 21 days (raw = true − drift). */
function demoDrift(t_days: number): number {
  return 0.006 * Math.min(1, Math.max(0, t_days / 21));
}

/** The demo site's fixed id. */
export const DEMO_SITE_ID = 'd3e05000-0000-4000-8000-000000000001';

/** Deterministic pseudo-random numbers in [0, 1) (mulberry32), so the demo is the same every time. */
function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A fixed UUID-shaped id for demo record `n` of a kind (kind digit 1–9). */
function demoId(kind: number, n: number): string {
  return `d3e05000-0000-4000-8${kind}00-${n.toString(16).padStart(12, '0')}`;
}

/** The invented true rating behind the demo data. */
export function demoRating(): Rating {
  const first = { fromStage_m: 0.12, coefficient: 6.0, offset_m: 0.12, exponent: 2.2 };
  const coefficient = continuousCoefficient(first, 0.02, 1.7, 0.55);
  return {
    segments: [first, { fromStage_m: 0.55, coefficient, offset_m: 0.02, exponent: 1.7 }],
    gaugedRange_m: [0.24, 1.42],
  };
}

function pulse(t_days: number, start_days: number, peak_m3s: number, tp_hours: number): number {
  const tau = (t_days - start_days) * 24;
  if (tau <= 0) return 0;
  const n = 3;
  return peak_m3s * Math.pow(tau / tp_hours, n) * Math.exp(n * (1 - tau / tp_hours));
}

/** The invented true discharge (m³/s) at t_days after the start of the logger record. */
export function demoFlow(t_days: number): number {
  const base = 0.19 * Math.pow(0.985, t_days);
  const groundwater = t_days > 13.5 ? 0.22 * (1 - Math.exp(-(t_days - 13.5) / 1.2)) * Math.exp(-(t_days - 13.5) / 9) : 0;
  return base + groundwater + pulse(t_days, 5.2, 0.35, 6) + pulse(t_days, 13.5, 7.2, 8);
}

/**
 * Builds the scenario so that the logger record ends at `end_ms` (UTC ms, rounded down to 15 min):
 * the storm is then about a week before the end.
 */
export function demoScenario(end_ms: number): DemoScenario {
  if (!Number.isFinite(end_ms) || end_ms <= 0) throw new RangeError(`demoScenario needs an end time in UTC ms; got ${end_ms}`);
  const end = Math.floor(end_ms / STEP_MS) * STEP_MS;
  const start = end - 21 * MS_PER_DAY;
  const rnd = seeded(0x5eed_03);
  const rating = demoRating();
  const site: DemoItem<SiteBody> = {
    id: DEMO_SITE_ID,
    code: 'PB-03',
    name: 'Pellow Burn at Lantern Bridge (demo)',
    area_km2: 12.4,
    datum: { description: 'Invented demo datum: bolt on the downstream bridge abutment', elevation_m: 212.35 },
    location: { lat: -41.2871, lon: 174.6302 },
    timeZone: 'Pacific/Auckland',
    displayUnits: 'metric',
    jumpLimit_m: 0.3,
  };
  // The true stage every 15 minutes (mm noise, 1 mm resolution) and the logger's raw value (drifting low).
  const count = Math.floor((end - start) / STEP_MS) + 1;
  const time_ms = new Float64Array(count);
  const true_m = new Float64Array(count);
  const raw_m = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const t = start + i * STEP_MS;
    const q = demoFlow((t - start) / MS_PER_DAY);
    const noise = (rnd() - 0.5) * 0.004;
    time_ms[i] = t;
    true_m[i] = Math.round((stageAt(rating, q) + noise) * 1000) / 1000;
    raw_m[i] = Math.round((true_m[i] - demoDrift((t - start) / MS_PER_DAY)) * 1000) / 1000;
  }
  const readings: DemoItem<ReadingBody>[] = [];
  for (let d = 1, k = 0; d < 21; d += k % 2 === 0 ? 3 : 4, k++) {
    const t = start + d * MS_PER_DAY + 2 * 60 * 60_000;
    const i = Math.round((t - start) / STEP_MS);
    const offset = Math.floor(rnd() * 3) / 1000;
    readings.push({
      id: demoId(3, k + 1), siteId: DEMO_SITE_ID, time_ms: t, stage_m: Math.round((true_m[i] + offset) * 1000) / 1000,
      source: 'staff', quality: 'good', observer: 'J. Tarrant (demo)', note: 'Staff check beside the logger.', warnings: [],
      loggerCheck: { logger_m: raw_m[i] },
    });
  }
  const checks = readings.map((r) => ({ time_ms: r.time_ms, staff_m: r.stage_m, logger_m: r.loggerCheck!.logger_m }));
  const correction_m = driftCorrections(checks, time_ms);
  const loggerDays = splitLoggerDays({ time_ms, raw_m, correction_m }, { siteId: DEMO_SITE_ID, fileName: 'pb03-logger-demo.csv', checks, note: 'Invented demo logger record.' })
    .map((body) => ({ id: loggerDayId(DEMO_SITE_ID, body.day), ...body }));
  readings.sort((a, b) => a.time_ms - b.time_ms);
  const gaugingStages = [0.26, 0.29, 0.31, 0.34, 0.38, 0.45, 0.52, 0.63, 0.78, 0.95, 1.18, 1.42];
  const gaugings: DemoItem<GaugingBody>[] = gaugingStages.map((h, i) => {
    const scatter = (rnd() - 0.5) * 0.08;
    const q = dischargeAt(rating, h) * (1 + scatter);
    return {
      id: demoId(4, i + 1), siteId: DEMO_SITE_ID, time_ms: start - (340 - i * 28) * MS_PER_DAY + 23 * 60 * 60_000,
      meanStage_m: h, discharge_m3s: Math.round(q * 1000) / 1000, method: 'velocity-area',
      grade: Math.abs(scatter) < 0.025 ? 'good' : 'fair', observer: 'J. Tarrant (demo)', note: '',
    };
  });
  const ratingRecord: DemoItem<RatingBody> = {
    id: demoId(5, 1), siteId: DEMO_SITE_ID, validFrom_ms: start - 365 * MS_PER_DAY,
    segments: rating.segments, gaugedRange_m: rating.gaugedRange_m, shifts: [],
    fittedFrom: gaugings.map((g) => g.id), note: 'Demo rating: invented two-segment curve.',
  };
  return { site, rating: ratingRecord, gaugings, readings, loggerDays };
}

/** The demo's logger record as arrays: times (UTC ms), corrected stages, raw values and corrections (m). */
export function demoLoggerRecord(s: Pick<DemoScenario, 'loggerDays'>): { time_ms: Float64Array; stage_m: Float64Array; raw_m: Float64Array; correction_m: Float64Array } {
  const n = s.loggerDays.reduce((sum, d) => sum + d.offset_ms.length, 0);
  const out = { time_ms: new Float64Array(n), stage_m: new Float64Array(n), raw_m: new Float64Array(n), correction_m: new Float64Array(n) };
  let k = 0;
  for (const d of s.loggerDays) {
    for (let i = 0; i < d.offset_ms.length; i++, k++) {
      out.time_ms[k] = d.day * MS_PER_DAY + d.offset_ms[i];
      out.raw_m[k] = d.raw_m[i];
      out.correction_m[k] = d.correction_m[i];
      out.stage_m[k] = d.raw_m[i] + d.correction_m[i];
    }
  }
  return out;
}
