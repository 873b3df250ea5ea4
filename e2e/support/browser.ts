import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { BASE_URL, root } from './server-process';

export const SCREENSHOT_DIR = join(root, 'e2e', 'screenshots');

export interface Session {
  context: BrowserContext;
  page: Page;
  /** Every URL the page asked for, to prove nothing comes from another host. */
  requests: string[];
  close(): Promise<void>;
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
