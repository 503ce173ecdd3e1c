// Request promises that are not awaited one by one: their failure aborts the transaction and is
// reported once through tx.done, so each is given a handler to keep it from counting as unhandled.

/** Marks a request's promise as handled; the transaction's own failure reports the error. */
export function quietly(p: Promise<unknown>): void {
  p.catch(() => undefined);
}
