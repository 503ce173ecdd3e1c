// The Data screen's exchange in Chromium at 360×640 on the demo site: readings imported from a CSV file
// (a bad file lists its lines and imports nothing), then exported as CSV (read back by papaparse, a
// test-only oracle: hostile notes neutralised per OWASP "CSV Injection", a stage of −0.31 m kept a number)
// and as WaterML 2.0 Part 1 and Part 2 (validated against the OGC schemas by the offline kit, xmllint).
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Preview } from '../support/browser/harness';
import { loadDemoSite, openApp, type AppSession } from '../support/browser/app';
import { seriousViolations } from '../support/browser/axe';
import { validateWaterml } from '../support/waterml-kit';

let server: Preview;
let page: Page;
let app: AppSession | undefined;
const dir = mkdtempSync(join(tmpdir(), 'freshet-data-'));
// Two days ago, on the whole minute: inside the default export window (30 days up to the latest reading).
const T = Math.floor((Date.now() - 2 * 86_400_000) / 60_000) * 60_000;
const iso = (ms: number) => new Date(ms).toISOString().replace('.000Z', 'Z');

beforeAll(async () => {
  app = await openApp(4560, { hash: '#/sites', controlled: false });
  ({ server, page } = app);
  await loadDemoSite(page);
});

afterAll(async () => {
  await app?.close();
});

async function download(what: string): Promise<string> {
  await page.getByLabel('What').selectOption({ label: what });
  const [file] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download' }).click()]);
  const path = join(dir, file.suggestedFilename());
  await file.saveAs(path);
  return path;
}

describe('Data: CSV import and exports', () => {
  it('lists the bad lines of a CSV file and imports nothing from it', async () => {
    await page.goto(`${server.url}#/data`);
    await page.getByLabel('CSV file').setInputFiles({
      name: 'bad.csv', mimeType: 'text/csv',
      buffer: Buffer.from(`time,stage_m,quality,note\n${iso(T)},0.5,good,\n2026-05-01T08:15:00,0.5,good,\n${iso(T + 60_000)},1 2,good,\n`),
    });
    await page.getByText('Nothing can be imported until these lines are right:').waitFor();
    await expect(page.getByText(/^Line 3: the time "2026-05-01T08:15:00" has no UTC offset/).count()).resolves.toBe(1);
    await expect(page.getByText('Line 4: the stage "1 2" is not a number, e.g. 0.734').count()).resolves.toBe(1);
    await expect(page.getByRole('button', { name: /^Import \d+ readings/ }).count()).resolves.toBe(0);
  });

  it('imports readings from a CSV file after showing the first rows as they will be stored', async () => {
    const text = [
      'time,stage_m,quality,note',
      `${iso(T)},-0.31,good,"=HYPERLINK(""http://example.invalid"",""x"")"`,
      `${iso(T + 60_000)},0.412,fair,@obs`,
      `${iso(T + 120_000)},0.415,,+1 checked`,
    ].join('\r\n');
    await page.getByLabel('CSV file').setInputFiles({ name: 'staff.csv', mimeType: 'text/csv', buffer: Buffer.from(text) });
    await page.getByText('3 readings; the first as they will be stored:').waitFor();
    await expect(page.getByRole('cell', { name: '-0.310 m' }).count()).resolves.toBe(1);
    expect(await seriousViolations(page)).toEqual([]);
    await page.getByRole('button', { name: 'Import 3 readings into PB-03' }).click();
    await page.getByText('Imported 3 readings into PB-03.').waitFor({ timeout: 30_000 });
    // No sideways scroll at 360 px.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(360);
  });

  it('exports readings as CSV with no live formula and numbers kept numbers', async () => {
    const text = readFileSync(await download('Readings with discharge (CSV)'), 'utf8');
    expect(text.charCodeAt(0)).toBe(0xfeff);
    const rows = Papa.parse<Record<string, string>>(text.slice(1), { header: true, skipEmptyLines: true }).data;
    const mine = rows.filter((r) => r.source === 'staff' && r.observer === '' && r.note !== '');
    expect(mine.map((r) => r.note)).toEqual(["'=HYPERLINK(\"http://example.invalid\",\"x\")", "'@obs", "'+1 checked"]);
    expect(mine.map((r) => r.stage_m)).toEqual(['-0.3100', '0.4120', '0.4150']);
    for (const r of rows) for (const cell of Object.values(r)) expect(cell).not.toMatch(/^[=+@\t\r]/);
  });

  it('exports WaterML 2.0 Part 1 and Part 2 that validate against the OGC schemas', async () => {
    const part1 = await download('Stage and discharge series (WaterML 2.0 Part 1)');
    const part2 = await download('Ratings and gaugings (WaterML 2.0 Part 2)');
    const r = validateWaterml([part1, part2]);
    expect(r.output).toMatch(/timeseries.*: valid \(WaterML 2.0 Part 1/);
    expect(r.output).toMatch(/ratings\.xml: valid \(WaterML 2.0 Part 2/);
    expect(r.status).toBe(0);
    expect(readFileSync(part1, 'utf8')).toContain('<wml2:value>-0.31</wml2:value>');
  });
});
