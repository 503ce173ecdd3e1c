// The one rule for text that enters Freshet (forms, CSV and logger files, bundles): no NUL, no other
// control character (Unicode general category Cc: U+0000–U+001F, U+007F–U+009F) except tab and line feed
// (a carriage return only as part of CR LF), and no lone surrogate code unit. A lone surrogate is not a
// Unicode scalar value and RFC 8259 §8.2 warns that such strings behave unpredictably between programs;
// PostgreSQL's json types refuse \u0000. Text is either refused with a sentence or cleaned with one.

/** What is wrong with a text: the first offending code unit, its 1-based character position and what it is. */
export interface TextProblem {
  /** 1-based position of the character in the text (UTF-16 code units, as the text's length counts). */
  position: number;
  /** The offending code unit, e.g. 0 for NUL or 0xd800 for a lone high surrogate. */
  codeUnit: number;
  what: 'nul' | 'control' | 'lone-surrogate';
}

const hex4 = (n: number): string => `U+${n.toString(16).toUpperCase().padStart(4, '0')}`;

/** True for a code unit in Unicode's control category (Cc) that the rule refuses (all but tab and line feed). */
function isRefusedControl(c: number): boolean {
  return (c < 0x20 && c !== 0x09 && c !== 0x0a) || (c >= 0x7f && c <= 0x9f);
}

/** The first problem in `text` under the rule, or undefined when the text is fine. */
export function textProblem(text: string): TextProblem | undefined {
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c < 0x20 || (c >= 0x7f && c <= 0x9f)) {
      if (c === 0x0d && text.charCodeAt(i + 1) === 0x0a) continue;
      if (isRefusedControl(c)) return { position: i + 1, codeUnit: c, what: c === 0 ? 'nul' : 'control' };
    } else if (c >= 0xd800 && c <= 0xdbff) {
      const next = text.charCodeAt(i + 1);
      if (next >= 0xdc00 && next <= 0xdfff) i++;
      else return { position: i + 1, codeUnit: c, what: 'lone-surrogate' };
    } else if (c >= 0xdc00 && c <= 0xdfff) {
      return { position: i + 1, codeUnit: c, what: 'lone-surrogate' };
    }
  }
  return undefined;
}

/** A problem in words, e.g. "a NUL character (U+0000) at character 17". */
export function textProblemWords(p: TextProblem): string {
  const what =
    p.what === 'nul' ? 'a NUL character' : p.what === 'control' ? 'a control character' : 'half of a character pair with its other half missing';
  return `${what} (${hex4(p.codeUnit)}) at character ${p.position}`;
}

/** The requirement as the validators state it (one phrase, used in refusals). */
export const TEXT_RULE_WORDS = 'text without NUL or other control characters (tab and new line are fine) and without half character pairs';

/** A sentence refusing `text` for the field called `label` (e.g. "the note"), or undefined when it is fine. */
export function textRefusal(label: string, text: string): string | undefined {
  const p = textProblem(text);
  if (!p) return undefined;
  return `${label.charAt(0).toUpperCase()}${label.slice(1)} holds ${textProblemWords(p)}; remove it and try again.`;
}

/** The text cleaned under the rule: CR LF and lone CR become LF, other refused controls are removed, lone surrogates become U+FFFD. */
export function cleanText(text: string): { text: string; changed: number } {
  if (textProblem(text) === undefined && !text.includes('\r')) return { text, changed: 0 };
  let out = '';
  let changed = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x0d) {
      out += '\n';
      changed++;
      if (text.charCodeAt(i + 1) === 0x0a) i++;
    } else if (isRefusedControl(c)) {
      changed++;
    } else if (c >= 0xd800 && c <= 0xdbff && text.charCodeAt(i + 1) >= 0xdc00 && text.charCodeAt(i + 1) <= 0xdfff) {
      out += text[i] + text[i + 1];
      i++;
    } else if (c >= 0xd800 && c <= 0xdfff) {
      out += '\ufffd';
      changed++;
    } else {
      out += text[i];
    }
  }
  return { text: out, changed };
}

/** The first string anywhere in a JSON value (keys included) that breaks the rule: its path and problem. */
export function jsonTextProblem(x: unknown, path = '', depth = 0): { path: string; problem: TextProblem } | undefined {
  if (typeof x === 'string') {
    const problem = textProblem(x);
    return problem ? { path, problem } : undefined;
  }
  if (depth > 64 || typeof x !== 'object' || x === null) return undefined;
  if (Array.isArray(x)) {
    for (let i = 0; i < x.length; i++) {
      if (typeof x[i] === 'number') continue;
      const found = jsonTextProblem(x[i], `${path}[${i}]`, depth + 1);
      if (found) return found;
    }
    return undefined;
  }
  for (const [k, v] of Object.entries(x as Record<string, unknown>)) {
    const keyProblem = textProblem(k);
    if (keyProblem) return { path: path ? `${path} (a field name)` : '(a field name)', problem: keyProblem };
    const found = jsonTextProblem(v, path ? `${path}.${k}` : k, depth + 1);
    if (found) return found;
  }
  return undefined;
}
