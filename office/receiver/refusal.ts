// The receiver's refusals: a status, a short machine reason, a sentence for people, and for a refused
// record its position in the bundle. Also which database errors are the record's fault (400) rather than
// the office's (503).
import type { SyncRecord } from '../../core/index';
import type { Queryable } from './db';

/** Where a refused record sits in its bundle: its index (from 0), kind and id as the bundle gives them. */
export interface RecordPosition {
  index: number;
  kind?: string;
  id?: string;
}

/** A refusal answered as JSON: status, a short machine reason and a sentence for people. */
export class Refusal extends Error {
  constructor(
    readonly status: number,
    readonly reason: string,
    message: string,
    readonly position?: RecordPosition,
    readonly retryAfter_s?: number,
  ) {
    super(message);
    this.name = 'Refusal';
  }

  /** The JSON answer: `reason` (also as `error`, the name receivers used first), `message`, and the position of a refused record. */
  answer(): Record<string, unknown> {
    const p = this.position;
    return {
      error: this.reason, reason: this.reason, message: this.message,
      ...(p ? { index: p.index, ...(p.kind !== undefined ? { kind: p.kind } : {}), ...(p.id !== undefined ? { id: p.id } : {}) } : {}),
    };
  }
}

/** The position of record `index` of a (possibly unchecked) list of records: kind and id only when they are text. */
export function positionOf(records: readonly unknown[], index: number): RecordPosition {
  const r = records[index] as { kind?: unknown; id?: unknown } | undefined;
  const text = (x: unknown) => (typeof x === 'string' && x.length <= 200 ? x : undefined);
  return { index, kind: text(r?.kind), id: text(r?.id) };
}

/**
 * True for errors that say a value cannot be stored (SQLSTATE class 22, data exception: bad text, an
 * escape jsonb refuses, a number out of range; class 54, a program limit such as nesting) rather than
 * that the database is unreachable or failing. Both engines report the SQLSTATE as `code`.
 */
export function isDataError(err: unknown): boolean {
  const code = (err as { code?: unknown } | null)?.code;
  return typeof code === 'string' && /^(22|54)[0-9A-Z]{3}$/.test(code);
}

/**
 * Finds the first record the database cannot take as jsonb, by asking it about each record alone (only
 * after a data error, so the cost falls on the bad bundle). Undefined when each record passes alone.
 */
export async function findUnstorableRecord(db: Queryable, records: readonly SyncRecord[]): Promise<{ index: number; why: string } | undefined> {
  for (let i = 0; i < records.length; i++) {
    try {
      await db.query('select $1::text::jsonb is not null as ok', [JSON.stringify(records[i])]);
    } catch (err) {
      if (isDataError(err)) return { index: i, why: (err as Error).message };
      throw err;
    }
  }
  return undefined;
}
