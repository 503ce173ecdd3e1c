// Sending the outbox: the one push loop, run by the page (engine.ts) and by the service worker when no page
// is open (sw/background-push.ts). Each waiting bundle goes until the office acknowledges it; a refusal
// that concerns what is in a bundle (a record it cannot store, a bundle too large) is settled in the
// outbox (web/db/outbox-refusals.ts) and the loop goes on with the rebuilt bundles; any other failure
// stops the loop with the answer's meaning (retry later, or fix the settings). DOM-free.
import { readRefusal, statedLimit_bytes, type PushOutcome } from '../../core/index';
// Module by module, not web/db's index: the service worker's build has no DOM, and the index holds hooks.
import { acknowledge, nextOutgoing, noteAttempt } from '../db/outbox';
import { noteStatedLimit, refusedAsTooLarge, searchRefused, setAsideRefused } from '../db/outbox-refusals';
import { getSyncValue, noteSyncProblem } from '../db/sync-store';
import type { SyncSettings } from '../db/schema';
import { pushAnswer } from './http';
import { deliverPhotosOf } from './photo-delivery';

// The Background Sync tag and the worker's message to pages live in names.ts (no imports, so the first
// screen's triggers can name them without loading this module).
export { PUSH_TAG, SYNC_NOW_MESSAGE } from './names';
/** Most refusals settled in one run: each one sets a version aside or halves a bundle, so a run always progresses. */
export const MAX_REFUSALS_PER_RUN = 200;

/** How sending ended: everything sent (records delivered, versions set aside), or stopped on a failure. */
export type PushRun =
  | { kind: 'sent'; sent: number; setAside: number }
  | { kind: 'stopped'; outcome: Exclude<PushOutcome, { kind: 'delivered' }>; attempts: number; sent: number };

/** Sends every waiting bundle to the office of `settings`, settling refusals of what is in them. */
export async function pushWaiting(settings: SyncSettings): Promise<PushRun> {
  let sent = 0;
  let setAside = 0;
  for (let refusals = 0; ; ) {
    const entry = await nextOutgoing();
    if (!entry) return { kind: 'sent', sent, setAside };
    // Photo bytes first: the bundle goes only once the office confirmed every photo's hash.
    const photos = await deliverPhotosOf(settings, entry.bundle);
    if (photos.kind === 'set-aside' && refusals < MAX_REFUSALS_PER_RUN) {
      refusals++;
      await setAsideRefused(entry.id, photos.index, photos.message);
      setAside++;
      continue;
    }
    if (photos.kind !== 'ready') {
      const outcome = photos.kind === 'stopped' ? photos.outcome : { kind: 'fix' as const, message: photos.message };
      await noteAttempt(entry.id, Date.now());
      await noteSyncProblem(outcome);
      return { kind: 'stopped', outcome, attempts: entry.attempts + 1, sent };
    }
    const answer = await pushAnswer(settings, entry.bundle);
    const stated = statedLimit_bytes(answer.limitHeader);
    if (stated !== undefined) await noteStatedLimit(stated);
    if (answer.outcome.kind === 'delivered') {
      await acknowledge(entry.id);
      sent += entry.bundle.records.length;
      continue;
    }
    const refusal = answer.outcome.kind === 'fix' ? readRefusal(answer.raw, entry.bundle.records.length, answer.limitHeader) : undefined;
    if (refusal && refusals < MAX_REFUSALS_PER_RUN) {
      refusals++;
      if (refusal.kind === 'too-large') await refusedAsTooLarge(entry.id, refusal.limit_bytes);
      else if (refusal.index !== undefined) {
        await setAsideRefused(entry.id, refusal.index, refusal.message);
        setAside++;
      } else await searchRefused(entry.id, refusal.message);
      continue;
    }
    await noteAttempt(entry.id, Date.now());
    await noteSyncProblem(answer.outcome);
    return { kind: 'stopped', outcome: answer.outcome, attempts: entry.attempts + 1, sent };
  }
}

/** The stored office endpoint, or undefined (read here so the service worker needs no page module). */
export async function storedSettings(): Promise<SyncSettings | undefined> {
  return getSyncValue('settings');
}
