// Storm hydrograph analysis: key points, baseflow separation, event summary, unit hydrograph, recession, φ-index.
export type { Series, EventPoints, Gap } from './series';
export { runoffDuration_days, findEventPoints, findEventPointsDetailed } from './key-points';
export type { EventPointOptions, EventPointsDetailed } from './key-points';
export { findInflection, findInflectionDetailed } from './inflection';
export type { InflectionOptions, InflectionResult } from './inflection';
export { LOCAL_FIT_DEGREE } from './local-fit';
export {
  inflectionByNewtonPolynomial,
  forwardDifferences,
  newtonToPower,
  defaultNewtonPolynomialNodes,
} from './newton-polynomial';
export type { NewtonPolynomialOptions, NewtonPolynomialInflection } from './newton-polynomial';
export { separateBaseflow, separateBaseflowDetailed } from './separate';
export type { SeparationContext, SeparationResult } from './separate';
export {
  BFI_MAX_PRESETS,
  defaultChapmanMaxwell,
  defaultEckhardt,
  defaultLyneHollick,
  defaultSmoothedMinima,
  methodWithDefaults,
  SEPARATION_FAMILY,
  SEPARATION_FAMILY_SENTENCES,
  SEPARATION_METHOD_KINDS,
  usesKeyPoints,
} from './methods';
export type { BfiMaxPreset, MethodDefaultsOptions, SeparationFamily, SeparationMethod, SeparationMethodKind } from './methods';
export { localMinimumInterval_days } from './local-minimum';
export { seriesFromReadings } from './series-from-readings';
export type { DischargeReadings, SeriesFromReadings } from './series-from-readings';
export { summarizeEvent } from './summary';
export type { SummaryOptions, EventSummary } from './summary';
export { unitHydrograph, defaultUnitDepth_mm } from './unit-hydrograph';
export type { UnitHydrographOptions } from './unit-hydrograph';
export { recessionConstant } from './recession';
export type { RecessionFit } from './recession';
export { phiIndex } from './phi-index';
export { bridgingLimit_ms, usualStep_ms, BRIDGING_LIMIT_MAX_MS, BRIDGING_LIMIT_MIN_MS, BRIDGING_LIMIT_STEPS } from './bridging-limit';
export { dailyOnlyReason } from './daily-only';
export type { FilterRestart } from './split';
export type { PhiIndexResult } from './phi-index';
export {
  runoffRange, extrapolatedShare, roundDown, roundUp, DEFAULT_RATING_SE_PCT, EXTRAPOLATION_BAND_FACTOR,
} from './runoff-range';
export type { MethodVolume, RunoffRange, RunoffRangeInput } from './runoff-range';
export { continuousStretches, findStorms, MAX_STORMS, MIN_STORM_READINGS, stormWindow, STORM_PEAK_RATIO, type StormFound, type StormSearchSeries } from './storm-find';
