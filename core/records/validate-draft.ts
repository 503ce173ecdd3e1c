// Validation of a draft's fields.
import type { DraftBody } from './types';
import { requireJson, requireObject, requireRef, requireText } from './checks';

/** Checks a draft's fields (not its envelope); throws a RecordValidationError naming the first bad field. */
export function validateDraftBody(x: unknown): asserts x is DraftBody {
  const k = 'draft';
  const o = requireObject(k, 'draft', x);
  requireText(k, 'form', o.form, true, 60);
  if (o.siteId !== undefined) requireRef(k, 'siteId', o.siteId);
  requireObject(k, 'fields', o.fields);
  requireJson(k, 'fields', o.fields);
}
