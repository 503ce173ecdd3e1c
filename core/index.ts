// The public surface of the hydrometry core: pure functions on plain data (no DOM, no I/O, no clock).
export * from './units';
export { sortedIndex } from './sorted';
export * from './rating/index';
export * from './gauging/index';
export * from './hydrograph/index';
export * from './records/index';
export * from './demo/index';
export * from './time/index';
export * from './readings/index';
export * from './exchange/index';
export * from './sync/index';
