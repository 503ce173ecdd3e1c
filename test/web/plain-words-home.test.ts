// Plain error wording has one home (web/plain-words.ts, plainError): the storm screen's and the rating
// fit's wording go through it, and no screen, component or shell module shows a caught error's raw
// message. The source check fails if a second translator or a raw `err.message` on screen appears.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { INTERNAL_WORDS } from '../../web/plain-words';
import { plainMessage } from '../../web/screens/Storm/analysis';
import { plainFitMessage } from '../../web/screens/Ratings/fit-choice';
import { ROOT, sources } from '../support/store-writes';

describe('one translator of errors', () => {
  it('the storm and fit wordings are plainError with their own terms and fallback', () => {
    // Core's wording (core/hydrograph): the method kind is replaced by its name on screen.
    const storm = plainMessage('lyne-hollick needs at least 3 readings; got 2');
    expect(storm).toMatch(/ needs at least 3 readings; got 2\.$/);
    expect(storm).not.toMatch(/lyne-hollick/);
    expect(storm).not.toMatch(INTERNAL_WORDS);
    // A message that keeps an internal name falls back to the screen's own sentence.
    expect(plainMessage('summarizeEvent: baseflowAtPoints[2] of riseStart_ms 1767225600000 is wrong')).not.toMatch(INTERNAL_WORDS);
    expect(plainFitMessage('fitSegments needs at least 3 distinct stages; got 2')).toBe('The rating fit needs at least 3 distinct stages; got 2.');
  });

  it('no screen, component or shell module shows a caught error’s raw message', () => {
    const raw = /\b(?:err|e|error|ex)\s*\)?\.message\b|\(\s*(?:err|e|error)\s+as\s+\w+\s*\)\.message/;
    const files = [...sources('web/screens'), ...sources('web/components'), ...sources('web/app'), ...sources('web/sync')];
    const found = files.flatMap((f) =>
      readFileSync(join(ROOT, f), 'utf8').split('\n').flatMap((line, i) => (raw.test(line) ? [`${f}:${i + 1}`] : [])),
    );
    expect(found).toEqual([]);
  });

  it('has no second translator: no other module rewrites internal names in messages', () => {
    // The sign of a translator: a replace over camelCase or snake_case names, as plain-words.ts does.
    const translator = /replace\(\/\\b\[a-z\]|INTERNAL_WORDS\s*=|\.replace\(\/\^?\w+[A-Z]\w*\b/;
    const files = sources('web').filter((f) => f !== 'web/plain-words.ts');
    const found = files.filter((f) => translator.test(readFileSync(join(ROOT, f), 'utf8')));
    expect(found).toEqual([]);
  });
});
