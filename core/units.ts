// Exact unit factors (NIST SP 811) and the conversions used at the screen edge. Everything inside
// the app is SI: metres, m³/s, m/s, km², mm, m³.

/** Metres per international foot (exact). */
export const M_PER_FT = 0.3048;
/** Cubic metres per second per cubic foot per second (exact, 0.3048³). */
export const M3S_PER_CFS = 0.028316846592;
/** Square kilometres per square mile (exact, 1.609344²). */
export const KM2_PER_MI2 = 2.589988110336;
/** Millimetres per inch (exact). */
export const MM_PER_IN = 25.4;
/** Cubic metres per acre-foot (exact with the international foot: 43 560 × 0.3048³). */
export const M3_PER_ACRE_FT = 1233.48183754752;

function finite(fn: string, x: number): number {
  if (!Number.isFinite(x)) throw new RangeError(`${fn} needs a finite number; got ${String(x)}`);
  return x;
}

/** Feet to metres. */
export const ftToM = (x_ft: number): number => finite('ftToM', x_ft) * M_PER_FT;
/** Metres to feet. */
export const mToFt = (x_m: number): number => finite('mToFt', x_m) / M_PER_FT;
/** ft³/s to m³/s. */
export const cfsToM3s = (q_cfs: number): number => finite('cfsToM3s', q_cfs) * M3S_PER_CFS;
/** m³/s to ft³/s. */
export const m3sToCfs = (q_m3s: number): number => finite('m3sToCfs', q_m3s) / M3S_PER_CFS;
/** Square miles to square kilometres. */
export const mi2ToKm2 = (a_mi2: number): number => finite('mi2ToKm2', a_mi2) * KM2_PER_MI2;
/** Square kilometres to square miles. */
export const km2ToMi2 = (a_km2: number): number => finite('km2ToMi2', a_km2) / KM2_PER_MI2;
/** Inches to millimetres. */
export const inToMm = (d_in: number): number => finite('inToMm', d_in) * MM_PER_IN;
/** Millimetres to inches. */
export const mmToIn = (d_mm: number): number => finite('mmToIn', d_mm) / MM_PER_IN;
/** Acre-feet to cubic metres. */
export const acreFtToM3 = (v_acreFt: number): number => finite('acreFtToM3', v_acreFt) * M3_PER_ACRE_FT;
/** Cubic metres to acre-feet. */
export const m3ToAcreFt = (v_m3: number): number => finite('m3ToAcreFt', v_m3) / M3_PER_ACRE_FT;

/** The unit system a screen shows: SI ('metric') or US customary ('us'). */
export type UnitSystem = 'metric' | 'us';

/** A kind of value shown on screen; its SI unit is the one stored (m, m, m³/s, m/s, km², mm, m³). */
export type DisplayQuantity = 'stage' | 'length' | 'discharge' | 'velocity' | 'area' | 'depth' | 'volume';

interface UnitPair {
  /** SI units per display unit in the US system. */
  perUs: number;
  metric: string;
  us: string;
}

const UNITS: Record<DisplayQuantity, UnitPair> = {
  stage: { perUs: M_PER_FT, metric: 'm', us: 'ft' },
  length: { perUs: M_PER_FT, metric: 'm', us: 'ft' },
  discharge: { perUs: M3S_PER_CFS, metric: 'm³/s', us: 'ft³/s' },
  velocity: { perUs: M_PER_FT, metric: 'm/s', us: 'ft/s' },
  area: { perUs: KM2_PER_MI2, metric: 'km²', us: 'mi²' },
  depth: { perUs: MM_PER_IN, metric: 'mm', us: 'in' },
  volume: { perUs: M3_PER_ACRE_FT, metric: 'm³', us: 'acre-ft' },
};

function unitsOf(fn: string, quantity: DisplayQuantity, system: UnitSystem): UnitPair {
  if (!Object.prototype.hasOwnProperty.call(UNITS, quantity)) {
    throw new RangeError(
      `${fn}: unknown quantity "${String(quantity)}"; use one of ${Object.keys(UNITS).join(', ')}`,
    );
  }
  if (system !== 'metric' && system !== 'us') {
    throw new RangeError(`${fn}: unknown unit system "${String(system)}"; use 'metric' or 'us'`);
  }
  return UNITS[quantity];
}

/** Converts a stored SI value (m, m³/s, m/s, km², mm, m³ by quantity) to the display unit of `system`. */
export function toDisplay(quantity: DisplayQuantity, value_si: number, system: UnitSystem): number {
  const u = unitsOf('toDisplay', quantity, system);
  if (!Number.isFinite(value_si)) {
    throw new RangeError(`toDisplay needs a finite ${quantity} value; got ${String(value_si)}`);
  }
  return system === 'us' ? value_si / u.perUs : value_si;
}

/** Converts a value entered in the display unit of `system` to the stored SI unit. */
export function fromDisplay(quantity: DisplayQuantity, value: number, system: UnitSystem): number {
  const u = unitsOf('fromDisplay', quantity, system);
  if (!Number.isFinite(value)) {
    throw new RangeError(`fromDisplay needs a finite ${quantity} value; got ${String(value)}`);
  }
  return system === 'us' ? value * u.perUs : value;
}

/** The unit label shown beside a quantity ('m', 'ft', 'm³/s', 'ft³/s', 'km²', 'mi²', 'mm', 'in', …). */
export function displayUnit(quantity: DisplayQuantity, system: UnitSystem): string {
  const u = unitsOf('displayUnit', quantity, system);
  return system === 'us' ? u.us : u.metric;
}

/** Decimals a stage (m or ft) is shown with: millimetres in metric, hundredths of a foot in US units. */
export const STAGE_DECIMALS: Readonly<Record<UnitSystem, number>> = { metric: 3, us: 2 };

/** A stage or length (stored in m) as shown on screen with its unit, e.g. "0.734 m" or "2.41 ft". */
export function stageText(stage_m: number, units: UnitSystem): string {
  return `${toDisplay('stage', stage_m, units).toFixed(STAGE_DECIMALS[units])} ${displayUnit('stage', units)}`;
}
