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
  await settleAnimations(page);
  await page.evaluate(AXE_SOURCE);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: unknown, opts: unknown) => Promise<{ violations: { id: string; impact: string | null; help: string; nodes: { target: string[] }[] }[] }> } }).axe;
    const result = await axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] }, resultTypes: ['violations'] });
    return result.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, targets: v.nodes.slice(0, 5).map((n) => n.target.join(' ')) }));
  });
  return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}

/**
 * Waits until no finite CSS animation or transition is running (a dialog fading in, a label
 * floating), so colours are read at rest: text caught at half opacity fails the contrast rule on a
 * fast machine and passes on a slow one. Endless animations (progress spinners) are not waited for;
 * new ones that start while waiting are, up to ten rounds.
 */
export async function settleAnimations(page: Page): Promise<void> {
  await page.evaluate(async () => {
    for (let round = 0; round < 10; round++) {
      const running = document.getAnimations().filter((a) => {
        const end = a.effect?.getComputedTiming().endTime;
        return a.playState === 'running' && typeof end === 'number' && Number.isFinite(end);
      });
      if (running.length === 0) return;
      await Promise.all(running.map((a) => a.finished.catch(() => undefined)));
      await new Promise((resolve) => requestAnimationFrame(() => resolve(undefined)));
    }
  });
}
