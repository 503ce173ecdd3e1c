// Storm-hydrograph benchmarks: Eckhardt and Lyne–Hollick over 1,000,000 readings, each timed interleaved with a
// bare loop doing the same recursive passes, the automatic storm answer on 60 days of 5-minute logger readings,
// the key-point drag path on a 2,000-reading event, and memory.
import {
  findEventPoints,
  findEventPointsDetailed,
  separateBaseflow,
  separateBaseflowDetailed,
  summarizeEvent,
  type Series,
} from '../../core/hydrograph/index';
import { eckhardt } from '../../core/hydrograph/filters/eckhardt';
import { lyneHollick } from '../../core/hydrograph/filters/lyne-hollick';
import { performance } from 'node:perf_hooks';
import { emit, figure, medianMs, sig3 } from './measure';
import { loggerRecord, type StormModel } from '../support/logger-records';

const HOUR = 3_600_000;
const T0 = Date.UTC(2024, 0, 1);

/** A deterministic invented hourly record: base flow with a storm every 97 h. */
function longRecord(n: number): Series {
  const time_ms = new Float64Array(n);
  const discharge_m3s = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const tau = (i % 97) / 8;
    time_ms[i] = T0 + i * HOUR;
    discharge_m3s[i] = 1.5 + 0.5 * Math.sin(i / 2000) + 20 * tau ** 3 * Math.exp(3 * (1 - tau)) / 1;
  }
  return { time_ms, discharge_m3s };
}

/** One isolated invented storm, n readings every 6 minutes. */
function event(n: number): Series {
  const time_ms = new Float64Array(n);
  const discharge_m3s = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const h = i * 0.1;
    const x = Math.max(0, h - 10) / 12;
    time_ms[i] = T0 + h * HOUR;
    discharge_m3s[i] = 2 * Math.exp(-h / 500) + 30 * x ** 4 * Math.exp(4 * (1 - x));
  }
  return { time_ms, discharge_m3s };
}

/**
 * 60 days of 5-minute logger readings (17,281): simulated logger model of test/support/logger-records.ts with
 * six invented storms, 3 mm of stage noise and 1 mm resolution, seed 2025.
 */
function sixtyDaysOfLogger(): Series {
  const storms = [3, 11, 19.5, 30, 41, 52].map((day, k) => ({
    onset_h: 24 * day,
    peak_m3s: [6, 14, 4, 22, 9, 12][k],
    tp_h: [4, 6, 3, 8, 5, 7][k],
    n: [3, 4, 2.5, 3.5, 3, 4.5][k],
  }));
  const model: StormModel = { baseflow0_m3s: 1.6, baseflowK_days: 45, bursts: storms, span_h: 60 * 24, step_min: 5, stageNoise_m: 0.003, resolution_m: 0.001 };
  return loggerRecord(model, 2025);
}

/** Baseline for the storm answer: a copy of the discharges sorted (the n·log n work of one median over the record). */
function sortedCopy(q: Float64Array): Float64Array {
  return Float64Array.from(q).sort();
}

/** Baseline for Eckhardt: one bare recursive pass b_k = c·b_{k−1} + (1 − c)·Q_k, allocating its output like the filters do. */
function bareRecursivePass(q: Float64Array): Float64Array {
  const out = new Float64Array(q.length);
  let b = q[0];
  for (let k = 0; k < q.length; k++) {
    b = 0.98 * b + 0.02 * q[k];
    out[k] = b;
  }
  return out;
}

/** Baseline for Lyne–Hollick: the same three recursive passes (forward, backward, forward), bare, one output. */
function bareThreePasses(q: Float64Array): Float64Array {
  const n = q.length;
  const out = new Float64Array(n);
  const alpha = 0.999;
  const c = (1 + alpha) / 2;
  let f = 0;
  let previous = q[0];
  for (let k = 0; k < n; k++) {
    const x = q[k];
    f = alpha * f + c * (x - previous);
    previous = x;
    out[k] = x - f;
  }
  f = 0;
  previous = out[n - 1];
  for (let k = n - 1; k >= 0; k--) {
    const x = out[k];
    f = alpha * f + c * (x - previous);
    previous = x;
    out[k] = x - f;
  }
  f = 0;
  previous = out[0];
  for (let k = 0; k < n; k++) {
    const x = out[k];
    f = alpha * f + c * (x - previous);
    previous = x;
    out[k] = x - f;
  }
  return out;
}

/**
 * Times a baseline and a candidate interleaved (A B A B …) over `rounds` rounds so that a busy machine slows
 * both alike; returns the median of each and the median of the per-round ratios.
 */
function interleaved(baseline: () => unknown, candidate: () => unknown, rounds: number): { base: number; cand: number; ratio: number } {
  const base: number[] = [];
  const cand: number[] = [];
  const ratio: number[] = [];
  for (let r = 0; r < rounds; r++) {
    const t0 = performance.now();
    baseline();
    const t1 = performance.now();
    candidate();
    const t2 = performance.now();
    base.push(t1 - t0);
    cand.push(t2 - t1);
    ratio.push((t2 - t1) / (t1 - t0));
  }
  const median = (xs: number[]) => xs.sort((x, y) => x - y)[xs.length >> 1];
  return { base: median(base), cand: median(cand), ratio: median(ratio) };
}

function heapMb(): number {
  const m = process.memoryUsage();
  return (m.heapUsed + m.arrayBuffers) / 1e6;
}

export default async function run(): Promise<void> {
  const n = 1_000_000;
  const record = longRecord(n);
  const q = record.discharge_m3s as Float64Array;
  const rounds = 21;
  const eckCall = () => separateBaseflow(record, { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 });
  const lhCall = () => separateBaseflow(record, { kind: 'lyne-hollick' });
  // Everything is warmed up first so that no figure pays for compilation.
  for (let i = 0; i < 5; i++) {
    bareRecursivePass(q);
    bareThreePasses(q);
    eckCall();
    lhCall();
    eckhardt(q, 0.8, 0.98);
    lyneHollick(q, 0.999, 3, 720);
  }
  const eck = interleaved(() => bareRecursivePass(q), eckCall, rounds);
  emit({ name: 'bare-recursive-pass-1e6-ms', value: sig3(eck.base), unit: 'ms', note: 'baseline: one bare recursive loop over the same Float64Array, output allocated (median, interleaved with Eckhardt)' });
  emit({ name: 'eckhardt-1e6-ms', value: sig3(eck.cand), unit: 'ms' });
  figure({
    name: 'eckhardt-1e6-ratio',
    value: eck.cand,
    unit: 'ms',
    floor: eck.base,
    floor_is: 'one bare recursive pass over the same 1e6 values, output allocated',
    target: 'ratio <= 1.25 on a quiet machine',
    median_round_ratio: sig3(eck.ratio),
    note: 'whole separateBaseflow call (checks fused into the filter loop, the noise note sampled behind it from cache, per-day constant, 0 ≤ b ≤ Q); medians of 21 rounds, A B interleaved',
  });
  const eckKernel = interleaved(() => bareRecursivePass(q), () => eckhardt(q, 0.8, 0.98), rounds);
  emit({
    name: 'eckhardt-1e6-kernel-ratio',
    value: sig3(eckKernel.ratio),
    note: 'the filter loop alone (two readings a step, so its chain of arithmetic is half as long) / one bare pass',
  });
  const eckChecks = interleaved(() => eckhardt(q, 0.8, 0.98), eckCall, rounds);
  emit({
    name: 'eckhardt-1e6-call-over-loop-ratio',
    value: sig3(eckChecks.ratio),
    note: 'whole separateBaseflow call / the same filter loop alone: what reading and checking the times, checking the discharges and the noise note cost',
  });
  const lh = interleaved(() => bareThreePasses(q), lhCall, rounds);
  emit({ name: 'bare-three-passes-1e6-ms', value: sig3(lh.base), unit: 'ms', note: 'baseline: forward, backward, forward bare recursive passes, one output allocated' });
  emit({ name: 'lyne-hollick-1e6-ms', value: sig3(lh.cand), unit: 'ms' });
  emit({
    name: 'lyne-hollick-1e6-ratio',
    value: sig3(lh.ratio),
    target: '<= 2',
    note: 'whole separateBaseflow run (checks fused into the first pass, three passes, 30 days reflected at each end) / the same three bare passes, counted as one run; median of per-round ratios, A B interleaved',
  });
  const lhKernel = interleaved(() => bareRecursivePass(q), () => lyneHollick(q, 0.999, 3, 720), rounds);
  emit({
    name: 'lyne-hollick-1e6-per-pass-ratio',
    value: sig3(lhKernel.ratio / 3),
    note: 'the three-pass filter loop alone divided by 3 / one bare pass',
  });

  const sixty = sixtyDaysOfLogger();
  if (sixty.time_ms.length !== 17_281) throw new Error(`unreachable: 60 days of 5-minute readings are 17,281; got ${sixty.time_ms.length}`);
  const stormAnswer = () => {
    const found = findEventPointsDetailed(sixty, { area_km2: 50 });
    const sep = separateBaseflowDetailed(sixty, { kind: 'variable-slope' }, { points: found.points });
    return summarizeEvent(sixty, sep.baseflow, {
      area_km2: 50,
      from_ms: found.points.riseStart_ms,
      to_ms: found.points.runoffEnd_ms,
      baseflowAtPoints: sep.baseflowAtPoints,
    });
  };
  const sixtyQ = sixty.discharge_m3s as Float64Array;
  for (let i = 0; i < 5; i++) {
    stormAnswer();
    sortedCopy(sixtyQ);
  }
  const answer = interleaved(() => sortedCopy(sixtyQ), stormAnswer, 31);
  emit({ name: 'sorted-copy-17281-ms', value: sig3(answer.base), unit: 'ms', note: 'baseline: a sorted copy of the 17,281 discharges (median, interleaved)' });
  emit({
    name: 'key-points-separation-summary-17281-ms',
    value: sig3(answer.cand),
    unit: 'ms',
    target: '< 50',
    note: '60 days of simulated 5-minute logger readings with noise: findEventPointsDetailed (area 50 km²) + variable slope + summarizeEvent over the event (median)',
  });
  emit({ name: 'key-points-separation-summary-17281-ratio', value: sig3(answer.ratio), note: 'the storm answer / the sorted copy; median of per-round ratios, A B interleaved' });
  const lhAnswer = () => {
    const found = findEventPointsDetailed(sixty, { area_km2: 50 });
    const sep = separateBaseflowDetailed(sixty, { kind: 'lyne-hollick' });
    return summarizeEvent(sixty, sep.baseflow, { area_km2: 50, from_ms: found.points.riseStart_ms, to_ms: found.points.runoffEnd_ms });
  };
  emit({ name: 'key-points-lyne-hollick-summary-17281-ms', value: sig3(medianMs(lhAnswer, 31, 5)), unit: 'ms', note: 'the same with Lyne–Hollick over the whole 60 days (median)' });

  const storm = event(2000);
  const drag = medianMs(() => {
    const points = findEventPoints(storm);
    const b = separateBaseflow(storm, { kind: 'variable-slope' }, { points });
    return summarizeEvent(storm, b, { area_km2: 50 });
  }, 31, 5);
  emit({ name: 'key-points-variable-slope-summary-2000-ms', value: sig3(drag), unit: 'ms', target: '< 5' });
  const given = findEventPoints(storm);
  const dragGiven = medianMs(() => summarizeEvent(storm, separateBaseflow(storm, { kind: 'variable-slope' }, { points: given })), 31, 5);
  emit({ name: 'variable-slope-summary-given-points-2000-ms', value: sig3(dragGiven), unit: 'ms', note: 'the drag path: points given' });

  const gc = (globalThis as { gc?: () => void }).gc;
  if (gc) {
    gc();
    const before = heapMb();
    const held = longRecord(n);
    const baseflow = separateBaseflow(held, { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 });
    gc();
    const after = heapMb();
    emit({
      name: 'memory-1e6-readings-mb',
      value: sig3(after - before),
      unit: 'MB',
      target: '< 40',
      note: 'extra heap + array buffers after gc holding time_ms, discharge_m3s and an Eckhardt baseflow (3 × Float64Array)',
    });
    if (baseflow.length !== held.time_ms.length) throw new Error('unreachable: lengths differ');
  } else {
    emit({ name: 'memory-1e6-readings-mb', value: null, note: 'run with --expose-gc (npm run bench) to measure' });
  }
}
