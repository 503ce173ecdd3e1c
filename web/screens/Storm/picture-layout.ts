// The text of the shared storm picture laid out inside its width: words wrapped onto as many lines as
// they need, and a word longer than a whole line (a long site code, a path) broken between characters.
// Pure: the caller measures text (a canvas's measureText in the app, any function in tests).

/** Width of a text in the units the caller lays out in (canvas px in the app). */
export type Measure = (text: string) => number;

/** A text as lines no wider than max_px (a character wider than max_px still gets a line of its own). */
export function wrapText(text: string, max_px: number, measure: Measure): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter((w) => w !== '')) {
    const tried = line ? `${line} ${word}` : word;
    if (measure(tried) <= max_px) {
      line = tried;
      continue;
    }
    if (line) lines.push(line);
    line = '';
    // A word wider than a whole line is cut between characters.
    let rest = word;
    while (measure(rest) > max_px) {
      let n = 1;
      while (n < rest.length && measure(rest.slice(0, n + 1)) <= max_px) n++;
      lines.push(rest.slice(0, n));
      rest = rest.slice(n);
    }
    line = rest;
  }
  if (line) lines.push(line);
  return lines;
}
