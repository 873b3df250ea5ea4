import bcrypt from 'bcryptjs';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { createDb } from '../db/client';
import { people, type Role } from '../db/schema';
import { DEFAULT_DEMO_PASSWORD, demoEmail, demoPeople } from '../db/seed/demo-lab';
import { openBrowser, screenshot, type Session } from './support/browser';
import { BASE_URL, root } from './support/server-process';

/** What each role finds in the side navigation (the one table in src/app/core/layout/navigation.ts). */
const expectedNav: Record<Role, string[]> = {
  technician: ['Home', 'Runs', 'New run', 'Import', 'Instruments', 'Apparatus', 'Gases'],
  assistant: ['Home', 'Runs', 'New run', 'Import', 'Instruments', 'Apparatus', 'Gases'],
  investigator: ['Home', 'Runs', 'New run', 'Import', 'Instruments', 'Apparatus', 'Gases', 'Audit trail'],
  quality: ['Home', 'Runs', 'Instruments', 'Apparatus', 'Gases', 'Audit trail'],
  admin: ['Home', 'Instruments', 'Apparatus', 'Gases', 'People', 'Projects'],
};
const allEntries = ['Home', 'Runs', 'New run', 'Import', 'Instruments', 'Apparatus', 'Gases', 'Audit trail', 'People', 'Projects'];

let s: Session;
beforeEach(async () => {
  s = await openBrowser();
});
afterEach(async () => {
  await s.close();
});

async function signIn(email: string, password: string): Promise<void> {
  await s.page.goto('/');
  await s.page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await s.page.getByLabel('Email').fill(email);
  await s.page.getByLabel('Password', { exact: true }).fill(password);
  await s.page.getByRole('button', { name: 'Sign in' }).click();
}

describe('signing in', () => {
  it.each(demoPeople.map((p) => [p.role, p.name] as const))('the demo %s signs in, sees their navigation and signs out', async (role, name) => {
    await signIn(demoEmail(role), DEFAULT_DEMO_PASSWORD);
    const nav = s.page.getByRole('navigation', { name: /main/i });
    await nav.getByRole('link', { name: 'Home' }).waitFor();
    await s.page.getByRole('heading', { level: 1 }).waitFor();
    await s.page.waitForURL(`${BASE_URL}/home`, { timeout: 10_000 });
    await s.page.getByText(name.split(' ')[0]).first().waitFor({ state: 'visible' });
    // Every entry the role has is there first, so the absent ones are counted in a navigation that has rendered.
    for (const entry of expectedNav[role]) await nav.getByRole('link', { name: entry, exact: true }).waitFor();
    for (const entry of allEntries) {
      const visible = await nav.getByRole('link', { name: entry, exact: true }).count();
      expect([entry, visible > 0]).toEqual([entry, expectedNav[role].includes(entry)]);
    }
    // The global stylesheet applies (fonts, icons): a CSP-blocked stylesheet would leave ligature text.
    const looks = await s.page.evaluate(async () => {
      await document.fonts.ready;
      return { body: getComputedStyle(document.body).fontFamily, icons: document.fonts.check('24px "Material Symbols Outlined"') };
    });
    expect(looks.body).toMatch(/Source Sans 3/);
    expect(looks.icons).toBe(true);
    await screenshot(s.page, `home-${role}`);
    await s.page.getByRole('button', { name: /sign out/i }).click();
    await s.page.getByRole('heading', { name: 'Sign in' }).waitFor();
    // Nothing the app loaded came from another host.
    const foreign = s.requests.filter((u) => !u.startsWith(BASE_URL) && !u.startsWith('data:') && !u.startsWith('blob:'));
    expect(foreign).toEqual([]);
  });

  it('shows a clear message for a wrong password', async () => {
    await signIn(demoEmail('technician'), 'not-the-password');
    const alert = s.page.getByRole('alert');
    await alert.waitFor();
    expect(await alert.textContent()).toMatch(/email or password is not right/);
    await screenshot(s.page, 'sign-in-wrong-password');
  });

  it('shows the locked message, with the real wait, once the fifth wrong try locks the account', async () => {
    const email = `lock-${Date.now()}@e2e.test`;
    const handle = createDb(process.env['DATABASE_URL']!, 1);
    await handle.db.insert(people).values({ email, name: 'Lock Check', role: 'technician', passwordHash: await bcrypt.hash('right-password-123', 10) });
    await handle.close();
    await s.page.goto('/sign-in');
    const messages: string[] = [];
    for (let i = 0; i < 6; i++) {
      await s.page.getByLabel('Email').fill(email);
      await s.page.getByLabel('Password', { exact: true }).fill('wrong-password-123');
      const answer = s.page.waitForResponse((r) => r.url().endsWith('/api/auth/sign-in'));
      await s.page.getByRole('button', { name: 'Sign in' }).click();
      await answer;
      // The alert of the try before stays on screen until this answer renders, and tries 1–4 read alike. The page
      // says "Signing in…" on a disabled button while the request is out and renders the answer with the button
      // back: so the alert is read once the answer has come and the button is back, not as soon as an alert exists.
      await s.page.getByRole('button', { name: 'Sign in', exact: true, disabled: false }).waitFor();
      await s.page.getByRole('alert').waitFor();
      messages.push((await s.page.getByRole('alert').textContent()) ?? '');
    }
    // The same answer as for an unknown address until the account is locked (no "attempts left").
    expect(messages[0]).toMatch(/email or password is not right/);
    expect(messages[0]).not.toMatch(/attempts left/);
    expect(messages[4]).toMatch(/locked/i);
    expect(messages[5]).toMatch(/locked/i);
    expect(messages[5]).toMatch(/Try again after \d\d:\d\d UTC \(in 1[45] minutes\)/);
    await screenshot(s.page, 'sign-in-locked');
  });

  it('sends a signed-out visitor of a page to sign-in and back after signing in', async () => {
    await s.page.goto('/instruments');
    await s.page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await s.page.waitForURL(/returnUrl/, { timeout: 10_000 });
    await s.page.getByLabel('Email').fill(demoEmail('quality'));
    await s.page.getByLabel('Password', { exact: true }).fill(DEFAULT_DEMO_PASSWORD);
    await s.page.getByRole('button', { name: 'Sign in' }).click();
    await s.page.getByRole('heading', { level: 1, name: /instruments/i }).waitFor();
    await s.page.waitForURL(`${BASE_URL}/instruments`, { timeout: 10_000 });
    await screenshot(s.page, 'instruments-quality');
  });
});

describe('the built client', () => {
  it('references no other host from index.html or its stylesheets', () => {
    const dir = join(root, 'dist', 'qwell', 'browser');
    const files = ['index.html', ...readdirSync(dir).filter((f) => f.endsWith('.css'))];
    const hosts = files.flatMap((f) => readFileSync(join(dir, f), 'utf8').match(/https?:\/\/[^\s"')]+/g) ?? []);
    // The only absolute URLs allowed are the SVG/XML namespace identifiers, which are never fetched.
    expect(hosts.filter((u) => !u.startsWith('http://www.w3.org/'))).toEqual([]);
  });
});
