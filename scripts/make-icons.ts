// Renders public/icons/freshet.svg to the PNG icons of the web manifest with headless Chromium.
// Run once after changing the SVG: `npx tsx scripts/make-icons.ts`. The PNGs are committed.
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { launchBrowser, ROOT } from '../test/support/browser/harness';

const svg = readFileSync(join(ROOT, 'public/icons/freshet.svg'), 'utf8');
const browser = await launchBrowser({ width: 512, height: 512, touch: false });
const page = await browser.context.newPage();
async function render(size: number, maskable: boolean, file: string): Promise<void> {
  await page.setViewportSize({ width: size, height: size });
  // Maskable: full-bleed background, artwork shrunk into the central safe circle (80 % diameter).
  const body = maskable
    ? `<div style="width:${size}px;height:${size}px;background:#0d4a5c;display:grid;place-items:center">
         <div style="width:${size * 0.72}px;height:${size * 0.72}px">${svg}</div></div>`
    : `<div style="width:${size}px;height:${size}px">${svg}</div>`;
  await page.setContent(`<html><body style="margin:0;background:transparent">${body}</body></html>`);
  const png = await page.screenshot({ omitBackground: !maskable, clip: { x: 0, y: 0, width: size, height: size } });
  writeFileSync(join(ROOT, 'public/icons', file), png);
}
await render(192, false, 'freshet-192.png');
await render(512, false, 'freshet-512.png');
await render(512, true, 'freshet-maskable-512.png');
await browser.close();
