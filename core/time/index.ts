// Times in a site's zone: UTC ms inside, wall-clock time at the screen edge.
export { wallTimeAt, zoneOffset_min, instantOf, resolveWallTime, gapSentence, toLocalInput, toIsoWithOffset, type WallTime, type WallTimeAnswer } from './zoned';
export { parseLocalInput, readLocalInput, fromLocalInput } from './local-input';
export { daysInMonth, isLeapYear, daysFromCivil, utcOfCivil } from './civil';
export { clockChanges, type ClockChange } from './clock-changes';
export { MS_PER_DAY, MS_PER_HOUR } from './day';
