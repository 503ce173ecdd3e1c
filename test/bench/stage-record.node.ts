// The stage-record join (core's joinStageRecord: spot readings and logger days) and its discharge
// (dischargeThrough) for a 30-day window of 15-minute logger values (2,880) with a few spot readings,
// against a floor measured in the same run: copying the same values out of the day records into typed
// arrays. Figures only; targets are stated, never asserted.
import { dischargeThrough, joinStageRecord, splitLoggerDays, type DatedRating } from '../../core/index';
import { emit, medianMs, sig3 } from './measure';

export default async function stageRecordBench(): Promise<void> {
  const t0 = Date.UTC(2026, 0, 1);
  const q = 900_000;
  const n = 2880;
  const time_ms = Float64Array.from({ length: n }, (_, i) => t0 + i * q);
  const days = splitLoggerDays(
    { time_ms, raw_m: Float64Array.from(time_ms, (_, i) => 0.5 + 0.2 * Math.sin(i / 96)), correction_m: Float64Array.from(time_ms, (_, i) => i / 1e6) },
    { siteId: 'bench', fileName: 'bench.csv', checks: [] },
  );
  const spots = { time_ms: [t0 + 3 * q, t0 + 1000 * q, t0 + 2000 * q], stage_m: [0.5, 0.6, 0.55], source: [0, 0, 0] };
  const ratings: DatedRating[] = [{ id: 'r1', validFrom_ms: 0, segments: [{ fromStage_m: 0.1, coefficient: 10, offset_m: 0.1, exponent: 2 }], shifts: [] }];
  const floor = () => {
    const t = new Float64Array(n);
    const h = new Float64Array(n);
    let k = 0;
    for (const d of days) for (let i = 0; i < d.offset_ms.length; i++, k++) {
      t[k] = d.day * 86_400_000 + d.offset_ms[i];
      h[k] = d.raw_m[i] + d.correction_m[i];
    }
    return h[k - 1];
  };
  const joined = () => {
    const r = joinStageRecord(spots, days, -Infinity, Infinity);
    return dischargeThrough(ratings, r.time_ms, r.stage_m).discharge_m3s[0];
  };
  const floor_ms = medianMs(floor, 51, 10);
  const ms = medianMs(joined, 51, 10);
  emit({ name: 'stage-record-join-30d-with-discharge-ms', value: sig3(ms), target: '< 5', unit: 'ms', floor_ms: sig3(floor_ms), ratio: sig3(ms / floor_ms), values: n + spots.time_ms.length });
}
