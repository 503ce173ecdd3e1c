// One home for a record's usual step (core/hydrograph/bridging-limit.ts usualStep_ms), beside the bridging
// limit it is counted in: storm finding and the logger file's holes both take it from there, and no second
// definition exists.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { bridgingLimit_ms, loggerGaps, usualStep_ms } from '../../../core';
import { ROOT, sources } from '../../support/store-writes';

const MIN = 60_000;
const HOME = 'core/hydrograph/bridging-limit.ts';
const USERS = ['core/hydrograph/storm-find.ts', 'core/exchange/logger-gaps.ts'];

describe("a record's usual step", () => {
  it('is the median of its steps, the lower middle one of an even count (the definition of a median, exact)', () => {
    // Steps 15, 15, 15, 60 min: the middle two are 15 and 15.
    expect(usualStep_ms([0, 15 * MIN, 30 * MIN, 45 * MIN, 105 * MIN])).toBe(15 * MIN);
    // Steps 5, 10, 20, 40 min (in any order): the lower middle one is 10.
    expect(usualStep_ms([0, 40 * MIN, 45 * MIN, 65 * MIN, 75 * MIN])).toBe(10 * MIN);
    // Odd count: steps 1, 2, 9 h, the middle is 2 h.
    expect(usualStep_ms([0, 60 * MIN, 180 * MIN, 720 * MIN])).toBe(120 * MIN);
    expect(usualStep_ms([5])).toBe(0);
    expect(usualStep_ms([])).toBe(0);
  });

  it('sets the bridging limit and the logger holes alike: a 15-minute record bridges 3 h and has a hole over 22.5 min (DOMAIN.md §4, our rule)', () => {
    const t = [0, 15, 30, 45, 60, 90, 105].map((m) => m * MIN);
    expect(bridgingLimit_ms(usualStep_ms(t))).toBe(180 * MIN);
    expect(loggerGaps(t, [1, 2, 3, 4, 5, 6, 7]).map((g) => [g.afterLine, g.beforeLine])).toEqual([[5, 6]]);
  });

  it('is defined once, and storm finding and the logger holes import it from its home', () => {
    const code = [...sources('core'), ...sources('web'), ...sources('office'), ...sources('sw')];
    const defined = code.filter((f) => /\bfunction usualStep_ms\b|\busualStep_ms\s*=\s*\(/.test(readFileSync(join(ROOT, f), 'utf8')));
    expect(defined).toEqual([HOME]);
    for (const user of USERS) {
      expect(readFileSync(join(ROOT, user), 'utf8'), user).toMatch(/import \{[^}]*\busualStep_ms\b[^}]*\} from '(?:\.\.\/hydrograph\/|\.\/)bridging-limit'/);
    }
  });
});
