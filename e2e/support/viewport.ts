import type { Page } from 'playwright-core';
import { settleAnimations } from './axe';

/** The shell's navigation is a drawer over the page below this width and a side column from it (NARROW_QUERY in shell.ts). */
const SIDE_NAVIGATION_FROM_PX = 900;

/**
 * Resizes the viewport and returns once the app has followed: the window reports the new width, the shell's
 * navigation is in the mode for that width (beside the page and open when wide, closed over it when narrow) and
 * has stopped sliding, and no other finite animation runs. The app hears of a resize through a media-query
 * listener and a later render, so whatever is read right after setViewportSize may still be the old layout on a
 * fast machine. Pages without the shell (sign-in) wait for the width alone.
 */
export async function resizeTo(page: Page, width: number, height: number): Promise<void> {
  await page.setViewportSize({ width, height });
  await page.waitForFunction(
    ({ width, wide }) => {
      if (window.innerWidth !== width) return false;
      const nav = document.querySelector('mat-sidenav');
      if (!nav) return true;
      const c = nav.classList;
      if (c.contains('mat-drawer-animating')) return false;
      return wide ? c.contains('mat-drawer-side') && c.contains('mat-drawer-opened') : c.contains('mat-drawer-over') && !c.contains('mat-drawer-opened');
    },
    { width, wide: width >= SIDE_NAVIGATION_FROM_PX },
    { timeout: 10_000 },
  );
  await settleAnimations(page);
}
