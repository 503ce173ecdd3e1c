// Runs axe-core (npm axe-core, injected into the page) and returns its serious and critical findings.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';

const axePath = createRequire(import.meta.url).resolve('axe-core/axe.min.js');

/** A serious or critical accessibility violation, summarised for a readable test failure. */
export interface AxeFinding {
  id: string;
  impact: string;
  help: string;
  targets: string[];
}

/** Serious and critical axe-core violations on the page as it is now. */
export async function seriousViolations(page: Page): Promise<AxeFinding[]> {
  // Evaluated through the DevTools protocol, not added as a <script>: the app's Content-Security-Policy
  // refuses inline scripts, and a test must not weaken it.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(`${readFileSync(axePath, 'utf8')}\n;window.axe = axe;`);
  const results = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run(ctx: Document, opts: object): Promise<{ violations: { id: string; impact: string | null; help: string; nodes: { target: string[] }[] }[] }> } }).axe;
    const r = await axe.run(document, { resultTypes: ['violations'] });
    return r.violations.map((v) => ({ id: v.id, impact: v.impact ?? '', help: v.help, targets: v.nodes.map((n) => n.target.join(' ')) }));
  });
  return results.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}
