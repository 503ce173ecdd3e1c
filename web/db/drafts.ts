// Drafts: half-filled forms, saved on every change so nothing typed is lost. Local only, never synced.
import type { DraftRecord } from '../../core/records/index';
import { getIn, listRange, removeIn, saveIn, type SaveInput } from './records';

/** Saves a draft (new id when absent); resolves with the stored draft once it is durable. */
export const saveDraft = (draft: SaveInput<DraftRecord>): Promise<DraftRecord> => saveIn('drafts', draft);
/** The draft with this id, or undefined. */
export const getDraft = (id: string): Promise<DraftRecord | undefined> => getIn('drafts', id);
/** Removes a draft for good (after its form was saved or discarded). */
export const discardDraft = (id: string): Promise<void> => removeIn('drafts', id);

/** Drafts of a form (e.g. "reading"), newest first; only those of siteId when given. */
export async function listDrafts(form: string, siteId?: string): Promise<DraftRecord[]> {
  const drafts = await listRange('drafts', 'by-form', form, form);
  return drafts.filter((d) => siteId === undefined || d.siteId === siteId).sort((a, b) => b.updated_ms - a.updated_ms);
}
