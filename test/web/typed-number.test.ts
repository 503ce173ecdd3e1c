// Numbers typed on a phone keypad (issue 10 item 7): a comma or a point as the decimal mark, and a space
// inside a number refused rather than joined ("1 2" is not 12). The one parse every form uses.
import { describe, expect, it } from 'vitest';
import { decimalProblem, parseDecimal, spaceInsideNumber } from '../../web/format';

describe('parseDecimal', () => {
  it.each([
    ['12', 12],
    ['12.5', 12.5],
    ['12,5', 12.5], // comma decimal mark, as typed on European keypads (common practice)
    [' 0,734 ', 0.734],
    ['-0.25', -0.25],
    ['\u22120.25', -0.25], // the minus sign some keyboards give
    ['.5', 0.5],
  ])('reads %j as %d', (text, value) => {
    expect(parseDecimal(text)).toBe(value);
    expect(decimalProblem(text)).toBeUndefined();
  });

  it.each(['1 2', '1 234', '0, 5', '0 .5', '12\u00a03', '1\t2', '1 2,5'])('refuses %j (a space inside the number) with a sentence saying so', (text) => {
    expect(parseDecimal(text)).toBeUndefined();
    expect(spaceInsideNumber(text)).toMatch(/space inside the number/);
    expect(decimalProblem(text)).toMatch(/space inside the number.*without spaces/);
  });

  it.each(['abc', '1e23', '1.2.3', '', '--1', '0x10', 'Infinity'])('refuses %j as not a number', (text) => {
    expect(parseDecimal(text)).toBeUndefined();
    expect(decimalProblem(text)).toMatch(/is not a number/);
  });

  it('keeps a long hostile text short in the sentence', () => {
    expect(decimalProblem('<script>'.repeat(20))!.length).toBeLessThan(140);
  });
});
