// Whether a record's noise is large for its step, as a recursive filter sees it, said in one sentence.
import { medianStepChange, noiseSigma } from './noise';

/**
 * A plain sentence when the noise σ of the discharges (m³/s) is at least half the usual change from one
 * reading to the next: the filter's b ≤ Q constraint then turns the upward wiggles into quickflow and
 * lowers the baseflow index. Null when the noise is small for the step.
 */
export function filterNoiseNote(q: Float64Array, name: string, missing?: Uint8Array): string | null {
  // A note needs only an estimate: 4,096 evenly spaced differences keep it cheap beside a filter pass over 10⁶ readings.
  const sigma = noiseSigma(q, missing, 4096);
  const step = medianStepChange(q, missing, 4096);
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
