// A half-filled form kept as a draft in IndexedDB, for every form that has one (reading, gauging): written
// at once on each change (changes that come while a write is under way go into the next write), flushed
// before an update and when the app is hidden, tied to this tab so another open tab never restores it.
// The save that turns the form into a record passes `id.current` to web/db, which deletes the draft in the
// same transaction: a crash can never offer a saved record again.
import { useEffect, useRef } from 'preact/hooks';
import type { RefObject } from 'preact';
import type { DraftRecord, JsonValue } from '../../core/records/index';
import { discardDraft, listDrafts, saveDraft } from '../db';
import { isOtherTabOpen, tabId } from './draft-owner';
import { onBeforeUpdate } from './updates';

/** What a form needs to keep its draft: the form's name, its site, when it holds anything, its fields as JSON. */
export interface DraftSpec<F> {
  form: string;
  siteId: string;
  hasContent(f: F): boolean;
  toFields(f: F): { [key: string]: JsonValue };
  /** Told when a draft write fails (the form shows it in words). */
  onError(err: unknown): void;
}

/** The kept draft of one open form. */
export interface KeptDraft<F> {
  /** The draft's id once written or restored: pass it to the save so the draft goes in the same transaction. */
  id: RefObject<string | undefined>;
  /** Marks `f` as what the draft already holds (after a restore, a load or a save), so nothing is written for it. */
  markWritten(f: F): void;
  /** Writes whatever changed and waits until it is stored. */
  flush(): Promise<void>;
  /** Holds writing while a save is under way (true), then lets it go on (false). */
  pause(on: boolean): void;
}

/** The drafts of `form` at `siteId` that this tab may restore: its own, or those of a tab that is gone. */
export async function restorableDrafts(form: string, siteId: string): Promise<DraftRecord[]> {
  const out: DraftRecord[] = [];
  for (const d of await listDrafts(form, siteId)) {
    const owner = d.fields.tab;
    if (typeof owner === 'string' && (await isOtherTabOpen(owner))) continue;
    out.push(d);
  }
  return out;
}

/** Keeps `form` as a draft while `ready` (after any restore); see the file comment for the rules. */
export function useKeptDraft<F>(form: F, ready: boolean, spec: DraftSpec<F>): KeptDraft<F> {
  const id = useRef<string | undefined>(undefined);
  const formRef = useRef(form);
  formRef.current = form;
  const specRef = useRef(spec);
  specRef.current = spec;
  const written = useRef<F>(form);
  const writing = useRef<Promise<void> | undefined>(undefined);
  const paused = useRef(false);

  const write = async (f: F): Promise<void> => {
    written.current = f;
    const s = specRef.current;
    if (!s.hasContent(f)) {
      if (id.current) {
        const old = id.current;
        id.current = undefined;
        await discardDraft(old);
      }
      return;
    }
    const d = await saveDraft({ ...(id.current && { id: id.current }), form: s.form, siteId: s.siteId, fields: { ...s.toFields(f), tab: tabId() } });
    id.current = d.id;
  };
  const pump = (): void => {
    if (writing.current || paused.current || formRef.current === written.current) return;
    writing.current = write(formRef.current)
      .catch((err: unknown) => specRef.current.onError(err))
      .finally(() => {
        writing.current = undefined;
        pump();
      });
  };
  const flush = async (): Promise<void> => {
    pump();
    while (writing.current) await writing.current;
  };
  useEffect(() => {
    if (ready) pump();
  }, [form, ready]);
  useEffect(() => {
    const stopUpdate = onBeforeUpdate(flush);
    const onHide = () => document.visibilityState === 'hidden' && void flush();
    document.addEventListener('visibilitychange', onHide);
    return () => {
      stopUpdate();
      document.removeEventListener('visibilitychange', onHide);
      void flush();
    };
  }, []);
  return {
    id,
    markWritten: (f) => {
      written.current = f;
    },
    flush,
    // No write on resume: the form in hand may still be the one just saved (the next render brings the
    // cleared form), and writing it would offer a saved record again as a draft.
    pause: (on) => {
      paused.current = on;
    },
  };
}
