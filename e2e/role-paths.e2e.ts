import { RUN_STATE_LABELS, SIGNATURE_MEANINGS } from '../contract/runs';
import { DEFAULT_DEMO_PASSWORD } from '../db/seed/demo-lab';
import { openBrowser, screenshot, type Session } from './support/browser';
import { openedDialog } from './support/dialog';
import { BASE_URL } from './support/server-process';
import { signInAs } from './support/sign-in';

let s: Session;
/** How long the browser may wait on the server alone; a busy 2-core machine is slow, not wrong. */
const SERVER_WAIT_MS = 90_000;
beforeEach(async () => {
  s = await openBrowser();
});
afterEach(async () => {
  await s.close();
});

/** Opens a mat-select, picks the option whose text matches, and checks it took. */
async function choose(label: string | RegExp, option: RegExp): Promise<void> {
  const select = s.page.getByRole('combobox', { name: label });
  await select.click();
  const item = s.page.getByRole('option', { name: option }).first();
  await item.click();
  await item.waitFor({ state: 'detached' });
  expect(await select.textContent()).toMatch(option);
}

describe('a technician at the bench', () => {
  it('types a run\'s readings by keyboard, sees the draft saved, and submits it for the balance check', async () => {
    const { page } = s;
    const k = page.keyboard;
    await signInAs(page, 'technician');
    await page.getByRole('navigation', { name: /main/i }).getByRole('link', { name: 'New run' }).click();
    await page.getByRole('heading', { level: 1, name: 'New run' }).waitFor();
    await choose('Project', /Gas expansion/);
    await page.getByLabel('Title').fill(`Isothermal compression of nitrogen, e2e ${Date.now()}`);
    await choose('Process', /isothermal/i);
    await choose('Gas', /Nitrogen|N2/);
    await page.getByLabel('Amount n (mol)').fill('0.01');
    await choose('Apparatus', /PC-3/);
    await page.getByLabel('Ambient temperature', { exact: true }).fill('21');
    // The barometer is chosen from the register beside the ambient pressure (issue 12).
    await page.getByRole('heading', { name: 'Apparatus and ambient' }).scrollIntoViewIfNeeded();
    await page.getByLabel('Barometer').waitFor();
    await screenshot(page, 'run-entry-ambient');
    for (const name of ['Pressure', 'Volume', 'Temperature']) {
      await page.getByRole('checkbox', { name, exact: true }).focus();
      await k.press('Space');
    }
    await choose('Pressure instrument', /PG-2/);
    await choose('Temperature instrument', /TC-7/);
    await choose('Volume instrument', /SV-1/); // a channel with no instrument is refused at submit
    // The readings: typed cell by cell, Tab to the right, Enter down.
    await page.getByLabel('Reading 1, time in s').focus();
    const rows = [[0, 97.8, 250, 21.0], [10, 122.3, 200, 21.0], [20, 163.1, 150, 21.1], [30, 244.6, 100, 21.0], [40, 489.2, 50, 21.1]];
    for (const [i, row] of rows.entries()) {
      for (const [j, v] of row.entries()) {
        await k.type(String(v));
        await k.press(j < row.length - 1 ? 'Tab' : 'Enter');
      }
      // Enter on the last row adds a row and focuses it after the grid's next render; the Shift+Tabs start from
      // there only once it has (sent at once, on a fast machine they would walk back along the row just typed).
      await page.waitForFunction((prefix) => document.activeElement?.getAttribute('aria-label')?.startsWith(prefix) ?? false, `Reading ${i + 2}, `, { timeout: 10_000 });
      for (let j = 0; j < row.length - 1; j++) await k.press('Shift+Tab');
    }
    expect(await page.getByLabel('Reading 3, pressure in kPa').inputValue()).toBe('163.1');
    expect(await page.getByLabel('Reading 5, temperature in °C').inputValue()).toBe('21.1');
    await page.getByText(/Saved \d\d:\d\d/).waitFor({ timeout: 20_000 });
    // The first save gives the draft its address; waited for, not read at once (it may land just after the label).
    await page.waitForURL(/\/runs\/\d+\/edit$/, { timeout: 10_000 });
    // The pressure run carries the safety caution with the chosen apparatus's rating (PC-3: 1 MPa).
    await page.getByRole('note').filter({ hasText: /rated pressure/i }).filter({ hasText: /1000 kPa|10 bar/ }).first().waitFor();
    await screenshot(page, 'run-entry-technician');
    await page.getByRole('button', { name: 'Submit for the balance check' }).focus();
    await k.press('Enter');
    await page.waitForURL(/\/runs\/\d+$/, { timeout: 20_000 });
    // The run's own state line, not any "submitted" on the screen (a confirmation that fades would do too).
    await page.locator('dd.state').filter({ hasText: RUN_STATE_LABELS.submitted }).waitFor();
    await screenshot(page, 'run-page-after-submit');
  });
});

describe('an investigator', () => {
  it('approves a submitted run with an electronic signature', async () => {
    const { page } = s;
    await signInAs(page, 'investigator');
    await page.goto('/runs?state=submitted');
    await page.getByRole('link', { name: 'R-2026-0002' }).click();
    await page.getByRole('heading', { level: 1, name: /R-2026-0002/ }).waitFor();
    await page.getByText('Q − W').first().waitFor();
    await screenshot(page, 'run-page-investigator');
    // The printable report downloads with the same session.
    const href = await page.getByRole('link', { name: 'Report (PDF)' }).getAttribute('href');
    const pdf = await s.context.request.get(href!);
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()['content-type']).toBe('application/pdf');
    expect((await pdf.body()).subarray(0, 5).toString()).toBe('%PDF-');
    await page.getByRole('button', { name: /Approve/ }).click();
    // Typed into only once the dialog has opened and taken the focus (see openedDialog).
    const dialog = await openedDialog(page);
    await dialog.getByLabel('Your password').fill(DEFAULT_DEMO_PASSWORD);
    await choose('Meaning of your signature', /reviewed this run and approve/);
    await screenshot(page, 'review-dialog');
    // As for the calibration: wait for the server's answer, then for the page to show it (a count
    // taken right after the dialog closed raced the page's reload on a loaded machine).
    const [signed] = await Promise.all([
      page.waitForResponse(
        (r) => r.request().method() === 'POST' && /\/api\/runs\/\d+\/approve$/.test(r.url()),
        { timeout: SERVER_WAIT_MS },
      ),
      dialog.getByRole('button', { name: 'Sign and approve' }).click(),
    ]);
    expect(signed.status()).toBeLessThan(300);
    await dialog.waitFor({ state: 'detached', timeout: SERVER_WAIT_MS });
    await page.getByRole('button', { name: /Approve/ }).first().waitFor({ state: 'detached', timeout: SERVER_WAIT_MS });
    // The run's state line, not the confirmation snack bar ("Run … approved."), which says so even if the page did not reload.
    await page.locator('dd.state').filter({ hasText: RUN_STATE_LABELS.approved }).waitFor({ timeout: SERVER_WAIT_MS });
    // The signature is listed with its meaning, word for word the contract's.
    await page.getByText(SIGNATURE_MEANINGS.approve[0]).first().waitFor();
  }, 4 * SERVER_WAIT_MS);
});

describe('a quality officer', () => {
  it('adds a calibration to an overdue instrument and verifies the audit chain', async () => {
    const { page } = s;
    await signInAs(page, 'quality');
    await page.getByRole('navigation', { name: /main/i }).getByRole('link', { name: 'Instruments' }).click();
    await page.getByRole('heading', { level: 1, name: 'Instruments' }).waitFor();
    await screenshot(page, 'instruments-register');
    await page.getByRole('link', { name: 'LD-3' }).click();
    await page.getByRole('heading', { level: 1, name: /LD-3/ }).waitFor();
    await page.getByRole('button', { name: /Add calibration/ }).click();
    // Typed into only once the dialog has opened and taken the focus: a fill that lost its focus to the dialog's
    // own first-field focus left the form invalid, and no POST came (seen once on a loaded machine).
    const dialog = await openedDialog(page);
    const today = new Date().toISOString().slice(0, 10);
    const nextYear = `${Number(today.slice(0, 4)) + 1}${today.slice(4)}`;
    await dialog.getByLabel('Calibrated on').fill(today);
    await dialog.getByLabel('Next due on').fill(nextYear);
    await dialog.getByLabel('Certificate').fill('HIAT-CAL-E2E');
    await dialog.getByLabel('Expanded uncertainty U').fill('0.02');
    // The dialog closes on the server's answer: wait for that answer (bounded, generous, a loaded
    // machine only delays it), check it was stored, then for the dialog's close animation.
    const submit = dialog.getByRole('button', { name: 'Add calibration' });
    // The form takes the four values as valid: the button is enabled (waited for, so a late validation render is not misread).
    await dialog.getByRole('button', { name: 'Add calibration', disabled: false }).waitFor({ timeout: 10_000 });
    const [saved] = await Promise.all([
      page.waitForResponse(
        (r) => r.request().method() === 'POST' && /\/api\/instruments\/\d+\/calibrations$/.test(r.url()),
        { timeout: SERVER_WAIT_MS },
      ),
      submit.click(),
    ]);
    expect(saved.status()).toBe(201);
    await dialog.waitFor({ state: 'detached', timeout: SERVER_WAIT_MS });
    // In the page's calibration history, not the confirmation snack bar that names the certificate too.
    await page.getByRole('table', { name: 'Calibration history' }).getByRole('cell', { name: 'HIAT-CAL-E2E' }).waitFor();
    await screenshot(page, 'instrument-detail-quality');
    await page.getByRole('navigation', { name: /main/i }).getByRole('link', { name: 'Audit trail' }).click();
    await page.getByRole('heading', { level: 1, name: /Audit trail/ }).waitFor();
    await page.getByRole('button', { name: 'Verify the chain' }).click();
    await page.getByText('Chain intact').waitFor();
    await screenshot(page, 'audit-trail-verified');
  }, 4 * SERVER_WAIT_MS);
});

describe('a student assistant', () => {
  it('sees only what an assistant may', async () => {
    const { page } = s;
    await signInAs(page, 'assistant');
    const nav = page.getByRole('navigation', { name: /main/i });
    // The assistant's own entries first, so the absent ones are counted in a navigation that has rendered.
    await nav.getByRole('link', { name: 'Import' }).waitFor();
    expect(await nav.getByRole('link', { name: 'Audit trail' }).count()).toBe(0);
    expect(await nav.getByRole('link', { name: 'People' }).count()).toBe(0);
    await nav.getByRole('link', { name: 'Import' }).click();
    await page.getByRole('heading', { level: 1, name: 'Import a logger file' }).waitFor();
    await screenshot(page, 'import-assistant');
    for (const path of ['/audit', '/people', '/projects']) {
      await page.goto(path);
      await page.getByText(/Not for your role/i).first().waitFor();
    }
    // A submitted run: readable, but no review buttons for an assistant.
    await page.goto('/runs?state=submitted');
    await page.getByRole('link', { name: 'R-2026-0003' }).click();
    await page.getByRole('heading', { level: 1, name: /R-2026-0003/ }).waitFor();
    // Counted once the page has loaded all it asks for (the run, its balance), not in between.
    await page.locator('mat-progress-bar').first().waitFor({ state: 'detached', timeout: SERVER_WAIT_MS });
    expect(await page.getByRole('button', { name: /Approve|Reject/ }).count()).toBe(0);
    expect(page.url().startsWith(BASE_URL)).toBe(true);
  });
});

describe('the other main screens', () => {
  it.each([
    ['admin', '/people', 'people-admin'],
    ['admin', '/projects', 'projects-admin'],
    ['quality', '/apparatus', 'apparatus-quality'],
    ['quality', '/gases', 'gases'],
    ['technician', '/runs', 'runs-list'],
  ] as const)('as %s, %s renders its heading', async (role, path, name) => {
    await signInAs(s.page, role);
    await s.page.goto(path);
    await s.page.getByRole('heading', { level: 1 }).waitFor();
    // A failed load shows its message after the heading: counted once the loading bar has gone, not before.
    await s.page.locator('mat-progress-bar').first().waitFor({ state: 'detached', timeout: SERVER_WAIT_MS });
    expect(await s.page.getByText(/Not for your role|Something went wrong/i).count()).toBe(0);
    // Any failed load shows in the one problem banner (qw-problem-banner), whatever its words.
    expect(await s.page.locator('.page-error').count()).toBe(0);
    await screenshot(s.page, name);
  });
});
