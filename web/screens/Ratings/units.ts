// Unit conversions the rating and gauging screens need beyond web/format: a power-law coefficient and
// an area in m², both between the site's display units and SI.
import { M3S_PER_CFS, M_PER_FT, type UnitSystem } from '../../../core';

/** A coefficient typed in display units (Q in ft³/s from h in ft when 'us') as SI (m³/s per m^b). */
export function coefficientToSi(c: number, exponent: number, units: UnitSystem): number {
  return units === 'us' ? (c * M3S_PER_CFS) / Math.pow(M_PER_FT, exponent) : c;
}

/** An SI coefficient (m³/s per m^b) in display units (ft³/s per ft^b when 'us'). */
export function coefficientFromSi(c_si: number, exponent: number, units: UnitSystem): number {
  return units === 'us' ? (c_si * Math.pow(M_PER_FT, exponent)) / M3S_PER_CFS : c_si;
}

/** A cross-section area in m² shown in display units: "12.4 m²" or "133 ft²" (3 significant figures). */
export function formatArea_m2(area_m2: number, units: UnitSystem): string {
  if (!Number.isFinite(area_m2)) return '—';
  const v = units === 'us' ? area_m2 / (M_PER_FT * M_PER_FT) : area_m2;
  return `${v.toPrecision(3)} ${units === 'us' ? 'ft²' : 'm²'}`;
}
