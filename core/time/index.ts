// Times in a site's zone: UTC ms inside, wall-clock time at the screen edge.
export { wallTimeAt, zoneOffset_min, instantOf, toLocalInput, fromLocalInput, toIsoWithOffset, type WallTime } from './zoned';
export { MS_PER_DAY, MS_PER_HOUR } from './day';
