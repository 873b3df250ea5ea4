import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';

/** axe-core's own build, from the pinned npm package (never fetched at run time). */
const AXE_SOURCE = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

export interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  targets: string[];
}

/**
 * Runs axe-core on the page as it stands and returns the serious and critical violations (WCAG 2 A
 * and AA rules). The source is evaluated through the DevTools protocol, which the page's CSP does not
 * govern, so nothing is added to the app for the check.
 */
export async function seriousViolations(page: Page): Promise<AxeViolation[]> {
  await page.evaluate(AXE_SOURCE);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: unknown, opts: unknown) => Promise<{ violations: { id: string; impact: string | null; help: string; nodes: { target: string[] }[] }[] }> } }).axe;
    const result = await axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] }, resultTypes: ['violations'] });
    return result.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, targets: v.nodes.slice(0, 5).map((n) => n.target.join(' ')) }));
  });
  return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}
