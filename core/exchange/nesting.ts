// How deeply a bundle's JSON may nest objects and lists inside one another. A receiver that serialises or
// stores a value walks it recursively (JSON.stringify, PostgreSQL's jsonb), so a hostile document nested
// thousands of levels deep would overflow a stack; the limit is checked by a walk that uses no recursion.

/** Deepest nesting allowed in a bundle, counting the bundle object as level 1 (records are level 3, bodies level 4). */
export const MAX_BUNDLE_DEPTH = 32;

/** True when `value` nests objects and lists more than `limit` levels deep (an object or list is one level; a number or text is none). */
export function nestedDeeperThan(value: unknown, limit: number): boolean {
  const stack: [unknown, number][] = [[value, 1]];
  while (stack.length > 0) {
    const [v, depth] = stack.pop() as [unknown, number];
    if (typeof v !== 'object' || v === null) continue;
    if (depth > limit) return true;
    const children = Array.isArray(v) ? v : Object.values(v as Record<string, unknown>);
    for (const c of children) if (typeof c === 'object' && c !== null) stack.push([c, depth + 1]);
  }
  return false;
}
