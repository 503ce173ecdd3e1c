// Named (prepared) statements on PGlite. PGlite's query() sends five protocol messages, each its own call
// into the engine, and parses and plans the statement every time. A statement run for every push is
// instead parsed once per engine under a name; each run is then one call into the engine (bind, describe,
// execute, sync) reusing the plan. Its columns come back as text (or null): give them as text in the SQL.
import { protocol, type PGlite } from '@electric-sql/pglite';

const { serialize } = protocol;

/** Runs `sql` as the named statement `name` with `params`, preparing it first on this engine if needed. */
export async function runNamed<T>(
  db: PGlite,
  prepared: Set<string>,
  name: string,
  sql: string,
  params: readonly unknown[],
  inTransaction: boolean,
): Promise<T[]> {
  return db.runExclusive(async () => {
    if (!prepared.has(name)) {
      await db.execProtocol(joined([serialize.parse({ name, text: sql, types: [] }), serialize.sync()]), { throwOnError: true, syncToFs: false });
      prepared.add(name);
    }
    const message = joined([
      serialize.bind({ statement: name, values: params.map(asText) }),
      serialize.describe({ type: 'P' }),
      serialize.execute({}),
      serialize.sync(),
    ]);
    const { messages } = await db.execProtocol(message, { throwOnError: true, syncToFs: !inTransaction });
    let names: string[] = [];
    const rows: T[] = [];
    for (const m of messages) {
      if (m.name === 'rowDescription') names = (m as unknown as { fields: { name: string }[] }).fields.map((f) => f.name);
      else if (m.name === 'dataRow') {
        const values = (m as unknown as { fields: (string | null)[] }).fields;
        rows.push(Object.fromEntries(names.map((n, i) => [n, values[i]])) as T);
      }
    }
    return rows;
  });
}

// Parameters travel as text, as PGlite's own query() sends them for these types. Long text (a bundle's
// document) travels as its UTF-8 bytes, encoded by Node in one call, in binary format, which a text
// parameter takes as its UTF-8 bytes: the engine's protocol writer would otherwise measure and encode it
// character by character.
const AS_BYTES_FROM = 4096;

function asText(x: unknown): string | Uint8Array | null {
  if (x === null || x === undefined) return null;
  if (typeof x !== 'string') return String(x);
  return x.length >= AS_BYTES_FROM ? Buffer.from(x, 'utf8') : x;
}

function joined(parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}
