// Saving a reading from the form under faults: the draft goes in the same transaction as the reading
// (a crash right after Save cannot offer a saved reading again), a stale edit is refused instead of
// silently winning, and a saved reading cannot move to another site.
import { describe, expect, it } from 'vitest';
import { deleteReading, getReading, latestReading, listReadings, saveDraft, saveReading, saveSite } from '../../web/db/index';
import { getDraft } from '../../web/db/drafts';
import { useFreshDb } from '../support/db';
import { reading, site, T0 } from '../support/records';

const { clock } = useFreshDb();

describe('saveReading from the form', () => {
  it('removes the form draft in the same transaction, and keeps it when the save fails', async () => {
    const s = await saveSite(site());
    const draft = await saveDraft({ form: 'reading', siteId: s.id, fields: { stageText: '0.7' } });
    await expect(saveReading({ ...reading(s.id, T0, 0.7), stage_m: Number.NaN }, { draftId: draft.id })).rejects.toMatchObject({ field: 'stage_m' });
    expect(await getDraft(draft.id)).toBeDefined();
    const r = await saveReading(reading(s.id, T0, 0.7), { draftId: draft.id });
    expect(await getDraft(draft.id)).toBeUndefined();
    expect((await getReading(r.id))?.stage_m).toBe(0.7);
  });

  it('refuses an edit of a reading deleted or changed since the form opened, and writes nothing', async () => {
    const s = await saveSite(site());
    const r = await saveReading(reading(s.id, T0, 0.7));
    // Tab B changes it; tab A, opened before, saves: refused, B's change stays.
    const b = await saveReading({ ...r, note: 'from tab B' }, { expectedRev: r.rev });
    await expect(saveReading({ ...r, note: 'from tab A' }, { expectedRev: r.rev })).rejects.toMatchObject({ name: 'StorageError', reason: 'stale' });
    expect((await getReading(r.id))?.note).toBe('from tab B');
    // Tab B deletes it; tab A saves: refused, the reading stays deleted.
    await deleteReading(r.id);
    await expect(saveReading({ ...b, note: 'again' }, { expectedRev: b.rev })).rejects.toMatchObject({ reason: 'stale' });
    expect(await getReading(r.id)).toBeUndefined();
    expect(await listReadings(s.id, -Infinity, Infinity)).toEqual([]);
  });

  it('refuses to move a saved reading to another site', async () => {
    const a = await saveSite(site());
    const b = await saveSite(site({ code: 'KC-02' }));
    const r = await saveReading(reading(a.id, T0, 0.7));
    const err = await saveReading({ ...r, siteId: b.id }, { expectedRev: r.rev }).catch((e: unknown) => e);
    expect(err).toMatchObject({ name: 'StorageError', reason: 'moved' });
    expect((err as Error).message).toMatch(/cannot be moved to another site/);
    expect((await getReading(r.id))?.siteId).toBe(a.id);
  });
});

describe('a reading typed far in the future', () => {
  it('stays in the site list but is not the latest reading that sets the default windows', async () => {
    const s = await saveSite(site());
    const now = clock.now; // the device clock of the test: 2027-03-01
    const today = await saveReading(reading(s.id, now - 3_600_000, 0.7));
    const typo = await saveReading(reading(s.id, Date.UTC(2037, 2, 1), 0.71)); // 2037 for 2027
    const soon = await saveReading(reading(s.id, now + 3_600_000, 0.72)); // an hour ahead: a clock a little off
    expect((await listReadings(s.id, now - 86_400_000, Infinity)).map((r) => r.id)).toEqual([today.id, soon.id, typo.id]);
    expect((await latestReading(s.id))?.id).toBe(soon.id);
  });
});
