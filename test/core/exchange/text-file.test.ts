// One home for a text file's byte-order mark (core/exchange/text-file.ts): the phone and the office read a
// bundle file saved with one as the same bundle, CSV readers skip it, and no module strips it by hand.
// RFC 8259 §8.1 (from memory): a JSON parser may ignore a leading U+FEFF; it is no part of the JSON text.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { bundleJson, readCsvRecords, withoutBom } from '../../../core';
import { readBundleFile as officeRead } from '../../../office/shared/read-bundle';
import { readBundleFile as phoneRead } from '../../../web/sync/files';
import { bundleOf, readingRecords, siteRecord } from '../../support/office/phones';
import { ROOT, sources } from '../../support/store-writes';

const dir = mkdtempSync(join(tmpdir(), 'freshet-bom-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("a text file's byte-order mark", () => {
  it('is dropped once at the start and nowhere else', () => {
    expect(withoutBom('\uFEFFa,b')).toBe('a,b');
    expect(withoutBom('a\uFEFF')).toBe('a\uFEFF');
    expect(withoutBom('\uFEFF\uFEFFx')).toBe('\uFEFFx');
    expect(bundleJson('\uFEFF{"a":1}')).toEqual({ a: 1 });
    expect(() => bundleJson('\uFEFFnot json')).toThrow(SyntaxError);
    expect(readCsvRecords('\uFEFFstage,discharge\r\n1,2\r\n')[0].fields).toEqual(['stage', 'discharge']);
  });

  it('does not stop the phone or the office reading a bundle file saved with one, and both read the same bundle', async () => {
    const bundle = bundleOf('dev-bom', [siteRecord('dev-bom'), ...readingRecords('dev-bom', 3)]);
    const text = `\uFEFF${JSON.stringify(bundle)}`;
    writeFileSync(join(dir, 'b.json'), text);
    const office = await officeRead('import', 'b.json', dir);
    const phone = await phoneRead(new Blob([text], { type: 'application/json' }));
    expect(office).toEqual(bundle);
    expect(phone).toEqual({ bundle: office, blobs: new Map() });
  });

  it('is stripped only in core/exchange/text-file.ts (no hand-written U+FEFF replace or slice elsewhere)', () => {
    const code = [...sources('core'), ...sources('web'), ...sources('office'), ...sources('sw')].filter((f) => f !== 'core/exchange/text-file.ts');
    const byHand = /replace\(\/\^\\uFEFF|0xfeff/i;
    expect(code.filter((f) => byHand.test(readFileSync(join(ROOT, f), 'utf8')))).toEqual([]);
  });
});
