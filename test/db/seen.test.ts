// What a new version knows (core/sync/ancestry.ts), as the storage layer writes it: an edit carries in its
// `seen` list what this device's own versions of the record kept for review knew, since by device order
// it knows them. Without it an office receiving the versions in another order would keep a stale version
// for review again (order-dependent merge; test/core/sync/merge.test.ts has the pure case).
import { describe, expect, it } from 'vitest';
import { descends, formatRev, stampOf, toSyncRecord, type SyncRecord } from '../../core/index';
import { applyIncoming, getSite, listConflicts, saveSite } from '../../web/db/index';
import { site } from '../support/records';
import { useFreshDb } from '../support/db';

const { clock } = useFreshDb();
const SITE = '3c0d4b1e-7a2f-4e11-9b0a-00000000a002';

function siteFrom(device: string, wall_ms: number, name: string): SyncRecord {
  return { kind: 'site', id: SITE, rev: formatRev({ wall_ms, counter: 0, deviceId: device }), body: { ...site({ name }), updated_ms: wall_ms } } as SyncRecord;
}

describe('seen on save', () => {
  it("an edit of the record in use also carries what this device's own kept version knew", async () => {
    // A second phone's version reaches this one; this phone edits it (its version knows the second phone's).
    const other = siteFrom('phone-2', clock.now - 60_000, 'Fern Gully at bridge');
    await applyIncoming([other]);
    clock.now += 1000;
    const mine = await saveSite({ ...(await getSite(SITE))!, name: 'Fern Gully at the footbridge' });
    expect(mine.seen).toEqual([other.rev]);
    // The office changed the site without knowing either; its later revision wins here, mine is kept.
    const office = siteFrom('office-1', clock.now + 5000, 'Fern Gully at old bridge');
    await applyIncoming([office]);
    expect((await listConflicts(SITE)).map((c) => c.losing.rev)).toEqual([mine.rev]);
    // Editing the office's version (without settling) knows my kept version by device order, so it must
    // carry what that knew: the second phone's version as well as the office's.
    clock.now += 10_000;
    const next = await saveSite({ ...(await getSite(SITE))!, name: 'Fern Gully, footbridge' });
    expect(next.seen).toEqual([office.rev, other.rev].sort());
    const nextStamp = stampOf(toSyncRecord('site', next));
    expect(descends(nextStamp, stampOf(other))).toBe(true);
    expect(descends(nextStamp, stampOf(toSyncRecord('site', mine)))).toBe(true);
  });
});
