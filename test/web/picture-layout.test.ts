// Wrapping the shared picture's text: every line within the width by the given measure, no word lost or
// reordered. The measure is a fixed-pitch one (every character 7 units), so widths are exact arithmetic.
import { describe, expect, it } from 'vitest';
import { wrapText } from '../../web/screens/Storm/picture-layout';

const mono = (t: string) => 7 * t.length;

describe('wrapping the picture text', () => {
  it('keeps short text on one line', () => {
    expect(wrapText('Depth 24.6 mm · peak 12.3 m³/s', 700, mono)).toEqual(['Depth 24.6 mm · peak 12.3 m³/s']);
  });
  it('wraps a 60-character site name in a title at word boundaries, each line within the width', () => {
    const title = 'MF-01 · Millstone Ford below the old weir at the lower mill race bridge · storm of 2 Dec';
    const lines = wrapText(title, 300, mono);
    expect(lines.length).toBeGreaterThan(1);
    for (const l of lines) expect(mono(l)).toBeLessThanOrEqual(300);
    expect(lines.join(' ')).toBe(title);
  });
  it('cuts a word longer than a line between characters', () => {
    const lines = wrapText('code ABCDEFGHIJKLMNOPQRSTUVWXYZ end', 70, mono);
    expect(lines).toEqual(['code', 'ABCDEFGHIJ', 'KLMNOPQRST', 'UVWXYZ end']);
  });
});
