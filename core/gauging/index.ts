// Discharge measurement by velocity–area (mid-section) and the checks that go with it.
export type { MidSectionResult, Subsection, Vertical } from './types';
export { midSection, MAX_SUBSECTION_SHARE, MIN_VERTICALS } from './mid-section';
export {
  verticalMeanVelocity,
  suggestedVelocityMethod,
  SIX_TENTHS_DEPTH_LIMIT_M,
  type PointVelocities,
} from './vertical-velocity';
export { exceedsWadingLimit, WADING_LIMIT_M2S } from './wading';
