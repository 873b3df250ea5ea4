import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { BASE_URL, root } from './server-process';

export const SCREENSHOT_DIR = join(root, 'e2e', 'screenshots');

/**
 * Stress mode (opt-in): QWELL_E2E_ANIMATION_RATE=0.1 plays every CSS animation and transition at a tenth of its
 * speed, so a test that reads the screen while a dialog fades in, a label floats or the navigation slides fails
 * every time instead of only on a machine of the wrong speed. Unset (or 1): animations run as the app ships them.
 */
export function animationRate(): number | null {
  const raw = process.env['QWELL_E2E_ANIMATION_RATE'];
  if (raw === undefined || raw.trim() === '') return null;
  const rate = Number(raw);
  if (!Number.isFinite(rate) || rate <= 0) throw new Error(`QWELL_E2E_ANIMATION_RATE must be a positive number, got "${raw}"`);
  return rate === 1 ? null : rate;
}

export interface Session {
  context: BrowserContext;
  page: Page;
  /** Every URL the page asked for, to prove nothing comes from another host. */
  requests: string[];
  close(): Promise<void>;
}

/**
 * Sets the playback rate of the page's animations through the DevTools protocol. The rate stays with the session
 * for every document the page loads afterwards (measured: a goto and a reload keep it), so it is set once.
 */
async function slowAnimations(context: BrowserContext, page: Page, rate: number): Promise<void> {
  const cdp = await context.newCDPSession(page);
  await cdp.send('Animation.enable');
  await cdp.send('Animation.setPlaybackRate', { playbackRate: rate });
}

/** A fresh Debian chromium profile (never a downloaded browser), headless, no GPU. */
export async function openBrowser(): Promise<Session> {
  const profile = mkdtempSync(join(tmpdir(), 'qwell-e2e-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env['CHROMIUM_PATH'] ?? '/usr/bin/chromium',
    headless: true,
    baseURL: BASE_URL,
    viewport: { width: 1280, height: 800 },
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const rate = animationRate();
  if (rate !== null) await slowAnimations(context, page, rate);
  const requests: string[] = [];
  page.on('request', (r) => requests.push(r.url()));
  return {
    context,
    page,
    requests,
    close: async () => {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await page.screenshot({ path: join(SCREENSHOT_DIR, `${name}.png`), fullPage: true });
}
