// Saving a gauging from its form: the kept draft goes in the same transaction as the gauging, so a crash
// right after Save can never offer a saved gauging again (and a second Save cannot double it).
import { describe, expect, it } from 'vitest';
import { listGaugings, saveDraft, saveGauging, saveSite } from '../../web/db/index';
import { getDraft } from '../../web/db/drafts';
import { getGauging } from '../../web/db/gaugings';
import { useFreshDb } from '../support/db';
import { gauging, site, T0 } from '../support/records';

useFreshDb();

describe('saveGauging from the form', () => {
  it('removes the form draft in the same transaction, and keeps it when the save is refused', async () => {
    const s = await saveSite(site());
    const draft = await saveDraft({ form: 'gauging', siteId: s.id, fields: { meanStageText: '0.734' } });
    await expect(saveGauging({ ...gauging(s.id, T0), discharge_m3s: -1 }, { draftId: draft.id })).rejects.toMatchObject({ field: 'discharge_m3s' });
    expect(await getDraft(draft.id)).toBeDefined();
    expect(await listGaugings(s.id)).toHaveLength(0);
    const g = await saveGauging(gauging(s.id, T0), { draftId: draft.id });
    expect(await getDraft(draft.id)).toBeUndefined();
    expect((await getGauging(g.id))?.discharge_m3s).toBe(1.92);
  });

  it('keeps every other draft when a gauging saves without one', async () => {
    const s = await saveSite(site());
    const draft = await saveDraft({ form: 'gauging', siteId: s.id, fields: { meanStageText: '0.5' } });
    await saveGauging(gauging(s.id, T0));
    expect(await getDraft(draft.id)).toBeDefined();
  });
});
