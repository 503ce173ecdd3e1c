// Per test file: every fast-check property runs from the seed the global setup chose (property-seed.ts).
import fc from 'fast-check';
import { inject } from 'vitest';
import './property-seed';

fc.configureGlobal({ ...fc.readConfigureGlobal(), seed: inject('propertySeed') });
