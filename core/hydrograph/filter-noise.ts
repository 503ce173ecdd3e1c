// Whether a record's noise is large for its step, as a recursive filter sees it, said in one sentence.
import { sigmaOfSecondDifferences, StridedDifferences } from './noise';

/** Differences a note is estimated from: 4,096 evenly spaced ones keep it cheap beside a filter pass over 10⁶ readings. */
const NOTE_SAMPLE = 4096;

/** The samples filterNoiseNote reads: second differences (noise σ) and step changes, taken as a pass goes by. */
export class NoiseSamples {
  readonly second: StridedDifferences;
  readonly step: StridedDifferences;

  constructor(q: Float64Array, missing?: Uint8Array) {
    this.second = new StridedDifferences(q, 2, missing, NOTE_SAMPLE);
    this.step = new StridedDifferences(q, 1, missing, NOTE_SAMPLE);
  }

  /** Takes both samples' differences at indices below end. */
  takeBelow(end: number): void {
    this.second.takeBelow(end);
    this.step.takeBelow(end);
  }
}

/** Empty samples of q (m³/s) for noiseNoteOf: let them follow a pass over q, or take them all at once. */
export function noiseSamples(q: Float64Array, missing?: Uint8Array): NoiseSamples {
  return new NoiseSamples(q, missing);
}

/**
 * A plain sentence when the noise σ of the discharges (m³/s) is at least half the usual change from one
 * reading to the next: the filter's b ≤ Q constraint then turns the upward wiggles into quickflow and
 * lowers the baseflow index. Null when the noise is small for the step.
 */
export function filterNoiseNote(q: Float64Array, name: string, missing?: Uint8Array): string | null {
  return noiseNoteOf(noiseSamples(q, missing), q.length, name);
}

/** The note of filterNoiseNote from samples of a record of n readings (takes whatever of them is not yet taken). */
export function noiseNoteOf(samples: NoiseSamples, n: number, name: string): string | null {
  samples.takeBelow(n);
  const sigma = sigmaOfSecondDifferences(samples.second);
  const step = samples.step.median();
  if (!(sigma > 0 && step < 2 * sigma)) return null;
  return (
    `The record's noise (about ${sig(sigma)} m³/s) is large for its step: the usual change from one reading to the ` +
    `next is ${sig(step)} m³/s. ${name} counts the upward wiggles as quickflow, so its baseflow index is likely too low; ` +
    `light smoothing reduces this.`
  );
}

function sig(x: number): string {
  return String(Number(x.toPrecision(3)));
}
