// How one gauging checks the rating in force at its time: core's one home (core/rating/gauging-check.ts),
// with the shift in force then. The gauging list and entry import it from here.
export { gaugingCheck, type GaugingCheck } from '../../../core';
