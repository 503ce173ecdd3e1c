// Rating benchmarks: dischargeAt against a bare power-law loop in the same run, and fitRating on 100
// gaugings. Figures only; targets are stated, never asserted.
import { dischargeAt, fitRating, type Rating } from '../../core/rating/index';
import { normalGenerator, uniformGenerator } from '../support/noise';
import { emit, medianMs, sig3 } from './measure';

const N = 1_000_000;

export default async function ratingBench(): Promise<void> {
  const c = 11.2;
  const e = 0.31;
  const b = 1.74;
  const rating: Rating = { segments: [{ fromStage_m: e, coefficient: c, offset_m: e, exponent: b }] };
  const u = uniformGenerator(4242);
  const stages = new Float64Array(N);
  for (let i = 0; i < N; i++) stages[i] = 0.4 + 3 * u();
  const out = new Float64Array(N);

  const bare = () => {
    for (let i = 0; i < N; i++) out[i] = c * Math.pow(stages[i] - e, b);
    return out[N - 1];
  };
  const rated = () => {
    for (let i = 0; i < N; i++) out[i] = dischargeAt(rating, stages[i]);
    return out[N - 1];
  };
  // Alternate the two a few times so neither gets only the cold or only the warm machine.
  const baselines: number[] = [];
  const ours: number[] = [];
  for (let round = 0; round < 3; round++) {
    baselines.push(medianMs(bare, 9, 2));
    ours.push(medianMs(rated, 9, 2));
  }
  const baseline_ms = Math.min(...baselines);
  const ms = Math.min(...ours);
  emit({ name: 'dischargeAt-1e6-ratio', value: sig3(ms / baseline_ms), target: '<= 1.5', baseline_ms: sig3(baseline_ms), ms: sig3(ms) });

  const z = normalGenerator(99);
  const points = Array.from({ length: 100 }, () => {
    const h = 0.45 + 2.5 * u();
    return { stage_m: h, discharge_m3s: c * (h - e) ** b * Math.exp(0.04 * z()) };
  });
  const fitMs = medianMs(() => fitRating(points), 31, 5);
  emit({ name: 'fitRating-100-median-ms', value: sig3(fitMs), target: '< 5', unit: 'ms' });
}
