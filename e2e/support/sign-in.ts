import type { Page } from 'playwright-core';
import { DEFAULT_DEMO_PASSWORD, demoEmail } from '../../db/seed/demo-lab';
import type { Role } from '../../db/schema';

/** Signs the demo person of a role in through the sign-in page and waits for their home page. */
export async function signInAs(page: Page, role: Role): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('Email').fill(demoEmail(role));
  await page.getByLabel('Password', { exact: true }).fill(DEFAULT_DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('heading', { level: 1, name: /Good to see you/ }).waitFor();
}
