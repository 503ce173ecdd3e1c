// Small helpers for writing XML text: escaping, gml:id values that are valid XML names, and one
// element per call.

/** Text or attribute content with &, <, >, " and ' escaped, and characters XML 1.0 forbids dropped. */
export function escapeXml(text: string): string {
  return text
    // XML 1.0 §2.2: only tab, LF, CR and U+0020 upwards (less the surrogate-free gaps and U+FFFE/U+FFFF).
    .replace(/[^\t\n\r\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/gu, '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

/**
 * A gml:id (an XML NCName) from a prefix and a record id: a UUID may start with a digit, which a name
 * may not, so the prefix (letters, then letters, digits, '-', '_', '.') always comes first and any
 * other character of the id becomes '_'.
 */
export function gmlId(prefix: string, id: string): string {
  if (!/^[A-Za-z_][A-Za-z0-9_.-]*$/.test(prefix)) throw new RangeError(`gmlId needs a prefix that starts with a letter; got ${JSON.stringify(prefix)}`);
  return `${prefix}-${id.replace(/[^A-Za-z0-9_.-]/g, '_')}`;
}

/** Attributes of an element: name to value; undefined values are left out. */
export type XmlAttributes = Record<string, string | number | undefined>;

function attrs(a: XmlAttributes | undefined): string {
  if (!a) return '';
  let s = '';
  for (const [k, v] of Object.entries(a)) if (v !== undefined) s += ` ${k}="${escapeXml(String(v))}"`;
  return s;
}

/** An element with escaped text content, or empty when text is undefined. */
export function el(name: string, a?: XmlAttributes, text?: string): string {
  return text === undefined ? `<${name}${attrs(a)}/>` : `<${name}${attrs(a)}>${escapeXml(text)}</${name}>`;
}

/** An element wrapping already-written child elements. */
export function wrap(name: string, a: XmlAttributes | undefined, children: readonly string[]): string {
  return `<${name}${attrs(a)}>${children.join('')}</${name}>`;
}

/** Namespace declarations of WaterML 2.0 Part 1 and Part 2 documents, with their usual prefixes. */
export const WATERML_NAMESPACES = {
  'xmlns:gml': 'http://www.opengis.net/gml/3.2',
  'xmlns:om': 'http://www.opengis.net/om/2.0',
  'xmlns:sam': 'http://www.opengis.net/sampling/2.0',
  'xmlns:sams': 'http://www.opengis.net/samplingSpatial/2.0',
  'xmlns:swe': 'http://www.opengis.net/swe/2.0',
  'xmlns:wml2': 'http://www.opengis.net/waterml/2.0',
  'xmlns:xlink': 'http://www.w3.org/1999/xlink',
  'xmlns:xsi': 'http://www.w3.org/2001/XMLSchema-instance',
} as const;

/** The Part 2 namespace declaration. */
export const WATERML_PART2_NAMESPACE = { 'xmlns:wmlrgs': 'http://www.opengis.net/waterml/part2/1.0' } as const;
