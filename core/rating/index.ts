// Stage–discharge ratings: evaluate, invert, tabulate, check, fit, shift, grade.
export type { GaugingPoint, Rating, RatingSegment } from './types';
export { dischargeAt, segmentIndexAt } from './evaluate';
export { stageAt } from './inverse';
export { zeroFlowStage_m } from './zero-flow';
export { isExtrapolated } from './extrapolation';
export { ratingTable, RATING_TABLE_MAX_ROWS, type RatingTableRow } from './table';
export { ratingContinuity, continuousCoefficient, CONTINUITY_TOLERANCE, type BreakpointCheck } from './continuity';
export {
  fitRating,
  FIT_ADVISED_GAUGINGS,
  OFFSET_SEARCH_SPANS,
  USUAL_EXPONENT_RANGE,
  type FitRatingOptions,
  type RatingFit,
} from './fit';
export { johnsonOffset, johnsonOffsetOf } from './johnson';
export { shiftFor } from './shift';
export { constantShift, shiftFromCurve, type ShiftCurve } from './shift-curve';
export { shiftAt, type DatedShift } from './shift-schedule';
export { checksRating, gradeOf, GRADE_LIMITS_PCT, type MeasurementGrade } from './grade';
export { gaugingCheck, type GaugedPoint, type GaugingCheck } from './gauging-check';
export { validateRating } from './validate';
export { fitSegments, type FitSegmentsOptions, type SegmentsFit } from './fit-segments';
export { ratingFromTable, type TableRow } from './from-table';
export {
  dischargeAtTime, dischargeThrough, hasDischarge, NO_DISCHARGE, ratingInForce, type DatedRating, type DischargeSeries, type StageDischarge,
} from './in-force';
