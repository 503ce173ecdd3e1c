// The one home of the baseflow separation methods: their kinds, how each works, defaults and presets.
import { localMinimumInterval_days } from './local-minimum';

/**
 * A baseflow separation method: event methods use key points; the others are continuous filters.
 * Filter constants are per day, as published for daily data: Eckhardt's and Chapman–Maxwell's recession
 * constant and Lyne–Hollick's alpha are applied at the record's step Δt as c^(Δt/1 day) (exact for an
 * exponential recession; for Lyne–Hollick α our choice on sub-daily data, keeping its time constant in days).
 * Smoothed-minima blocks and the local-minimum interval are in days; on sub-daily records those two methods
 * work on daily mean flows, as published, and the daily baseflow is interpolated back to the readings.
 */
export type SeparationMethod =
  | { kind: 'constant-discharge' }
  | { kind: 'straight-line' }
  | { kind: 'concave' }
  | { kind: 'variable-slope' }
  | { kind: 'lyne-hollick'; alpha?: number; passes?: number }
  | { kind: 'eckhardt'; bfiMax: number; recession: number }
  | { kind: 'chapman-maxwell'; recession: number }
  | { kind: 'smoothed-minima'; block_days?: number; factor?: number }
  | { kind: 'local-minimum'; interval_days?: number };

/** A separation method kind. */
export type SeparationMethodKind = SeparationMethod['kind'];

/** How a method works: from the key points, a recursive filter over the record, or from low-flow minima. */
export type SeparationFamily = 'key-points' | 'recursive-filter' | 'minima';

/** The separation method kinds, grouped by family in the order a list shows them. */
export const SEPARATION_METHOD_KINDS = [
  'variable-slope',
  'constant-discharge',
  'straight-line',
  'concave',
  'lyne-hollick',
  'chapman-maxwell',
  'eckhardt',
  'smoothed-minima',
  'local-minimum',
] as const satisfies readonly SeparationMethodKind[];

/** The family of each method kind. */
export const SEPARATION_FAMILY: Record<SeparationMethodKind, SeparationFamily> = {
  'variable-slope': 'key-points',
  'constant-discharge': 'key-points',
  'straight-line': 'key-points',
  concave: 'key-points',
  'lyne-hollick': 'recursive-filter',
  'chapman-maxwell': 'recursive-filter',
  eckhardt: 'recursive-filter',
  'smoothed-minima': 'minima',
  'local-minimum': 'minima',
};

/** One plain sentence per family saying how its methods find the baseflow. */
export const SEPARATION_FAMILY_SENTENCES: Record<SeparationFamily, string> = {
  'key-points':
    'These methods draw the baseflow under one storm, from the flow where it starts to rise to the flow where direct runoff ends.',
  'recursive-filter':
    'These methods run the whole record through a filter that passes slow changes as baseflow and holds fast ones back as direct runoff.',
  minima:
    'These methods pick the lowest flows in spans of a few days and join them with straight lines to make the baseflow.',
};

/** True for the methods that draw baseflow between the key points (the others work on the whole window). */
export function usesKeyPoints(kind: SeparationMethodKind): boolean {
  return SEPARATION_FAMILY[kind] === 'key-points';
}

/**
 * Typical BFImax of Eckhardt's filter by stream and aquifer type (Eckhardt 2005, Hydrological Processes 19,
 * 507–515): perennial stream on a porous aquifer 0.80, ephemeral stream on a porous aquifer 0.50, perennial
 * stream on a hard-rock aquifer 0.25. Starting values to be replaced by a local estimate when there is one.
 */
export const BFI_MAX_PRESETS = {
  'perennial-porous': 0.8,
  'ephemeral-porous': 0.5,
  'perennial-hard-rock': 0.25,
} as const;

/** A stream and aquifer type with a BFImax preset. */
export type BfiMaxPreset = keyof typeof BFI_MAX_PRESETS;

/**
 * Default Eckhardt settings: recession constant a = 0.98 per day (the value for daily data; separateBaseflow
 * applies it at the record's step as a^(Δt/1 day)) and BFImax for a perennial stream on porous aquifers.
 */
export const defaultEckhardt = { recession: 0.98, bfiMax: BFI_MAX_PRESETS['perennial-porous'] } as const;

/**
 * Default Lyne–Hollick settings: α = 0.925 per day (published for daily data), 3 passes, 30 values reflected at
 * each end (30 days on daily data). separateBaseflow applies α at the record's step as α^(Δt/1 day) and
 * reflects 30 days of readings on sub-daily data.
 */
export const defaultLyneHollick = { alpha: 0.925, passes: 3, reflect: 30 } as const;

/**
 * Default Chapman–Maxwell recession constant k = 0.925 per day (as commonly used with daily data;
 * separateBaseflow applies it at the record's step as k^(Δt/1 day)).
 */
export const defaultChapmanMaxwell = { recession: 0.925 } as const;

/** Default smoothed-minima settings: 5-day blocks and a 0.9 turning-point factor. */
export const defaultSmoothedMinima = { block_days: 5, factor: 0.9 } as const;

/** What a method with defaults may still depend on: the Eckhardt aquifer type and the catchment area (km²). */
export interface MethodDefaultsOptions {
  bfiPreset?: BfiMaxPreset;
  area_km2?: number;
}

/**
 * The method of a kind with every parameter written out from the defaults, so a saved analysis can be repeated.
 * Local minimum without an area keeps its interval open: separateBaseflow then says what it needs.
 */
export function methodWithDefaults(kind: SeparationMethodKind, options?: MethodDefaultsOptions): SeparationMethod {
  switch (kind) {
    case 'variable-slope':
    case 'constant-discharge':
    case 'straight-line':
    case 'concave':
      return { kind };
    case 'lyne-hollick':
      return { kind, alpha: defaultLyneHollick.alpha, passes: defaultLyneHollick.passes };
    case 'chapman-maxwell':
      return { kind, recession: defaultChapmanMaxwell.recession };
    case 'eckhardt': {
      const preset = options?.bfiPreset;
      const bfiMax = preset === undefined ? defaultEckhardt.bfiMax : BFI_MAX_PRESETS[preset];
      if (bfiMax === undefined) throw new RangeError(`methodWithDefaults needs a known aquifer type; got ${String(preset)}`);
      return { kind, bfiMax, recession: defaultEckhardt.recession };
    }
    case 'smoothed-minima':
      return { kind, block_days: defaultSmoothedMinima.block_days, factor: defaultSmoothedMinima.factor };
    case 'local-minimum':
      return options?.area_km2 === undefined ? { kind } : { kind, interval_days: localMinimumInterval_days(options.area_km2) };
    default: {
      const unknown: never = kind;
      throw new RangeError(`methodWithDefaults needs a known method kind; got ${JSON.stringify(unknown)}`);
    }
  }
}
