import type { MidSectionResult, Subsection, Vertical } from './types';
import { WADING_LIMIT_M2S } from './wading';

/** Largest share of the total discharge one subsection should carry: 10 % (ISO 748 / common practice, from memory). */
export const MAX_SUBSECTION_SHARE = 0.1;
/** Fewest verticals a measurement should have: 20 (ISO 748, from memory; 25–30 recommended). */
export const MIN_VERTICALS = 20;

function validateVerticals(verticals: readonly Vertical[]): void {
  if (!Array.isArray(verticals) || verticals.length < 2) {
    throw new RangeError(
      `midSection needs at least 2 verticals (the two edges); got ${Array.isArray(verticals) ? verticals.length : 'no list'}`,
    );
  }
  let direction = 0;
  verticals.forEach((v, i) => {
    for (const [what, x] of [['station_m', v?.station_m], ['depth_m', v?.depth_m], ['velocity_mps', v?.velocity_mps]] as const) {
      if (typeof x !== 'number' || !Number.isFinite(x)) {
        throw new RangeError(`midSection needs a finite ${what} at vertical ${i}; got ${String(x)}`);
      }
    }
    if (v.depth_m < 0) throw new RangeError(`midSection needs depth_m ≥ 0 at vertical ${i}; got ${v.depth_m}`);
    const k = v.angleCoefficient;
    if (k !== undefined && !(typeof k === 'number' && k > 0 && k <= 1)) {
      throw new RangeError(`midSection needs an angleCoefficient in (0, 1] at vertical ${i}; got ${String(k)}`);
    }
    if (i > 0) {
      const step = Math.sign(v.station_m - verticals[i - 1].station_m);
      if (step === 0 || (direction !== 0 && step !== direction)) {
        throw new RangeError(
          `midSection needs stations strictly ascending or strictly descending across the section; vertical ${i} at ${v.station_m} m breaks the order after ${verticals[i - 1].station_m} m`,
        );
      }
      direction = step;
    }
  });
}

/**
 * Mid-section discharge (Turnipseed & Sauer 2010, USGS TM 3-A8; ISO 748): each vertical stands for half
 * the distance to each neighbour, q_i = v_i·k_i·d_i·(x_{i+1} − x_{i−1})/2, edges with their half-width.
 * Stations may run either way across the section; subsections come back in input order.
 */
export function midSection(verticals: readonly Vertical[]): MidSectionResult {
  validateVerticals(verticals);
  const n = verticals.length;
  const subsections: Subsection[] = [];
  const warnings: string[] = [];
  let discharge = 0;
  let area = 0;
  for (let i = 0; i < n; i++) {
    const v = verticals[i];
    const left = i > 0 ? verticals[i - 1].station_m : v.station_m;
    const right = i < n - 1 ? verticals[i + 1].station_m : v.station_m;
    const width = Math.abs(right - left) / 2;
    const a = v.depth_m * width;
    const q = v.velocity_mps * (v.angleCoefficient ?? 1) * a;
    subsections.push({ station_m: v.station_m, width_m: width, area_m2: a, discharge_m3s: q, share: 0 });
    discharge += q;
    area += a;
    const intensity = v.depth_m * Math.abs(v.velocity_mps);
    if (intensity >= WADING_LIMIT_M2S) {
      warnings.push(
        `At station ${v.station_m} m depth × velocity is ${intensity.toFixed(2)} m²/s, at or above the wading limit ${WADING_LIMIT_M2S.toFixed(2)} m²/s (10 ft²/s); do not wade.`,
      );
    }
  }
  if (!(area > 0)) {
    throw new RangeError('midSection needs some wetted area; every vertical has zero depth or no width');
  }
  if (discharge > 0) {
    for (const s of subsections) {
      s.share = s.discharge_m3s / discharge;
      if (s.share > MAX_SUBSECTION_SHARE) {
        warnings.push(
          `The subsection at station ${s.station_m} m carries ${(100 * s.share).toFixed(1)} % of the discharge; no subsection should carry more than ${100 * MAX_SUBSECTION_SHARE} % (ideally 5 %).`,
        );
      }
    }
  } else {
    warnings.push(`The total discharge is ${discharge.toPrecision(3)} m³/s, not positive; subsection shares are set to 0.`);
  }
  if (n < MIN_VERTICALS) {
    warnings.push(`Only ${n} verticals; at least ${MIN_VERTICALS} are needed (25–30 recommended).`);
  }
  const first = verticals[0].station_m;
  const last = verticals[n - 1].station_m;
  return {
    discharge_m3s: discharge,
    area_m2: area,
    width_m: Math.abs(last - first),
    meanVelocity_mps: discharge / area,
    subsections,
    warnings,
  };
}
