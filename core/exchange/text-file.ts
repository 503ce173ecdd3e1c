// A text file as the exchange readers take it (bundle files, CSV files): without the byte-order mark an
// editor or a spreadsheet may put first. U+FEFF is no part of the text: RFC 8259 §8.1 lets a JSON parser
// ignore it, and a CSV file saved for spreadsheets starts with one (csv-write.ts writes it).

/** `text` without a leading byte-order mark (U+FEFF). */
export function withoutBom(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** The JSON value of a bundle file's text, a leading byte-order mark ignored; throws JSON.parse's SyntaxError for text that is not JSON. */
export function bundleJson(text: string): unknown {
  return JSON.parse(withoutBom(text));
}
