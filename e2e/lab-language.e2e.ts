import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import type { Role } from '../db/schema';
import { loadFixture, runBodies } from '../testing/fixture-runs';
import { seriousViolations } from './support/axe';
import { openedDialog } from './support/dialog';
import { SCREENSHOT_DIR, openBrowser, screenshot, type Session } from './support/browser';
import { signInAs } from './support/sign-in';
import { resizeTo } from './support/viewport';

// Per role: the verdict appearing without a reload, the why-sentence, a readable audit row, the import
// checklist, and an axe-core check with no serious violations on each main screen the role opens.

let s: Session;
beforeEach(async () => {
  s = await openBrowser();
});
afterEach(async () => {
  await s.close();
});

/** The API as the signed-in page: same cookies, and the CSRF header the app's HttpClient would send. */
async function api(method: 'GET' | 'POST' | 'PUT', path: string, body?: unknown, multipart?: Record<string, unknown>) {
  const xsrf = (await s.context.cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
  const res = await s.context.request.fetch(path, { method, headers: { 'X-XSRF-TOKEN': xsrf }, data: body, multipart: multipart as never });
  const json = await res.json().catch(() => null);
  if (!res.ok()) throw new Error(`${method} ${path} answered ${res.status()}: ${JSON.stringify(json)}`);
  return json;
}

async function projectId(code: string): Promise<number> {
  const body = await api('GET', '/api/projects');
  return (body.items as { id: number; code: string }[]).find((p) => p.code === code)!.id;
}

/** A draft from a demo run document, created through the API as the signed-in author. */
async function draftFrom(fixture: string, title: string): Promise<{ id: number; code: string }> {
  const bodies = runBodies(loadFixture(fixture), await projectId('GX'));
  const created = await api('POST', '/api/runs', { ...bodies.create, title });
  await api('PUT', `/api/runs/${created.id}/readings`, { version: created.version, ...bodies.readings });
  return { id: created.id, code: created.code };
}

/**
 * axe-core on the current screen at 1366 and 390 px, with a screenshot of each: once the resize has landed and
 * the screen has loaded (no progress bar left), so the check reads the screen a person would read and not a
 * loading state that a fast machine skips and a slow one shows.
 */
async function checkScreen(page: Page, name: string): Promise<void> {
  for (const width of [1366, 390]) {
    await resizeTo(page, width, width === 390 ? 844 : 900);
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    await page.locator('mat-progress-bar').first().waitFor({ state: 'detached', timeout: 20_000 });
    const violations = await seriousViolations(page);
    expect({ screen: name, width, violations }).toEqual({ screen: name, width, violations: [] });
    await screenshot(page, `${name}-${width}`);
  }
  await resizeTo(page, 1366, 900);
}

/** The calorimetric demo run's first temperature as it was entered (°C, with the column's decimals). */
function doc2Temperature(): string {
  const values = loadFixture('calorimetric').readings.temperature.values;
  const decimals = Math.max(...values.map((v) => (String(v).split('.')[1] ?? '').length));
  return values[0].toFixed(decimals);
}

/** A screenshot of one chart (the page scrolls inside its own container, so a full-page shot misses it). */
async function chartShot(page: Page, selector: string, name: string): Promise<void> {
  const chart = page.locator(selector);
  await chart.scrollIntoViewIfNeeded();
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await chart.screenshot({ path: join(SCREENSHOT_DIR, `${name}.png`) });
}

describe('a technician', () => {
  it('submits a run and sees its verdict and why arrive without a reload', async () => {
    const { page } = s;
    await signInAs(page, 'technician');
    await checkScreen(page, 'home-technician');
    const run = await draftFrom('calorimetric-heat-leak-forgotten', `Bath run, heat leak left out, e2e ${Date.now()}`);
    await page.goto(`/runs/${run.id}/edit`);
    await page.getByRole('heading', { level: 2, name: 'Ready to submit' }).waitFor({ timeout: 20_000 });
    await checkScreen(page, 'run-entry-ready');
    // Phone width: each unit picker sits beside its value with a short visible label that stays inside its outline.
    await resizeTo(page, 390, 844);
    const picker = page.getByRole('combobox', { name: 'Ambient pressure unit' });
    await picker.scrollIntoViewIfNeeded();
    const field = picker.locator('xpath=ancestor::mat-form-field');
    const label = field.locator('mat-label');
    expect(await label.textContent()).toBe('Unit');
    const [fieldBox, labelBox] = [await field.boundingBox(), await label.boundingBox()];
    expect(labelBox!.x + labelBox!.width).toBeLessThanOrEqual(fieldBox!.x + fieldBox!.width);
    await chartShot(page, 'section[aria-labelledby="bench-heading"]', 'run-entry-units-390');
    await resizeTo(page, 1366, 900);
    await page.getByRole('button', { name: 'Submit for the balance check' }).click();
    await page.waitForURL(new RegExp(`/runs/${run.id}$`), { timeout: 20_000 });
    // No reload from here: the page asks again by itself until the check has stored its result.
    const card = page.locator('qw-balance-card');
    await card.getByText('Breaks').first().waitFor({ timeout: 45_000 });
    const why = card.locator('.why');
    expect(await why.textContent()).toMatch(/Why: No heat leak was accounted for: a heat-loss coefficient h ≈ [\d.]+ W\/K would close the balance\./);
    await checkScreen(page, 'run-page-breaks');
    // Phone width: the budget's share sits beside its source, and a line says the rest is a swipe away.
    await resizeTo(page, 390, 844);
    const budget = page.locator('qw-budget-table');
    await budget.getByText('swipe the table sideways').waitFor();
    expect((await budget.getByRole('columnheader').allTextContents()).map((t) => t.trim()).slice(0, 2)).toEqual(['Source', 'Share of u²(r)']);
    await chartShot(page, 'qw-budget-table', 'run-page-budget-390');
    await resizeTo(page, 1366, 900);
    await page.goto('/runs');
    await checkScreen(page, 'runs-list-technician');
  });
});

describe('a technician, on the charts and the pressure alert', () => {
  it('sees the claimed adiabat with CO₂\'s γ, the power axis in words, and a safety alert over the rated pressure', async () => {
    const { page } = s;
    await signInAs(page, 'technician');
    const doc = loadFixture('adiabatic');
    const bodies = runBodies(doc, await projectId('GX'));
    const firstPa = doc.readings.pressure!.values[0] * 1e3;
    // The rating set below the first reading, in kPa absolute, so every reading is over it.
    const apparatus = { ...doc.apparatus, ratedPressure: { value: Math.floor((0.9 * firstPa) / 1e3), unit: 'kPa' } };
    const created = await api('POST', '/api/runs', {
      ...bodies.create,
      title: `CO2 expansion over the rating, e2e ${Date.now()}`,
      setup: { ...bodies.create.setup, gas: { model: 'species', species: 'CO2' }, apparatus },
    });
    await api('PUT', `/api/runs/${created.id}/readings`, { version: created.version, ...bodies.readings });
    await page.goto(`/runs/${created.id}/edit`);
    await page.getByRole('heading', { level: 2, name: 'Ready to submit' }).waitFor({ timeout: 20_000 });
    await page.getByRole('button', { name: 'Submit for the balance check' }).click();
    await page.waitForURL(new RegExp(`/runs/${created.id}$`), { timeout: 20_000 });
    const alert = page.locator('aside.pressure-alert[role="alert"]');
    await alert.waitFor({ timeout: 45_000 });
    const alertText = (await alert.textContent())!.replace(/\s+/g, ' ');
    expect(alertText).toContain('Safety alert: above the rated pressure');
    // Said once, in kPa with its reference: not the engine's SI figures beside it.
    expect(alertText).toMatch(/Reading \d+ reaches [\d.]+ kPa absolute, above the vessel's rated [\d.]+ kPa absolute\./);
    expect(alertText).not.toMatch(/\d Pa\b/);
    // The note names the claimed curve once the result has reached the diagram: waited for, then read.
    const claimed = page.locator('qw-pv-diagram .note').filter({ hasText: 'claimed adiabat' });
    await claimed.waitFor();
    const note = (await claimed.textContent()) ?? '';
    // γ of CO₂ at the run's mean temperature (300 K → 227 K, about 264 K): between 1.28 and 1.32 (REFERENCES §2b:
    // 1.28854 at 298.15 K, rising as Cp falls with temperature), not the 1.4 of a diatomic gas.
    const gamma = Number(/claimed adiabat \(P·V\^γ = const, γ = (\d\.\d{3})\)/.exec(note)?.[1]);
    expect(gamma).toBeGreaterThan(1.28);
    expect(gamma).toBeLessThan(1.32);
    await checkScreen(page, 'run-page-pressure-alert');
    for (const width of [1366, 390]) {
      await resizeTo(page, width, 844);
      await chartShot(page, 'qw-pv-diagram', `run-page-pv-co2-${width}`);
    }
    await resizeTo(page, 1366, 900);

    const heated = await draftFrom('calorimetric', `Bath run, power axis, e2e ${Date.now()}`);
    await page.goto(`/runs/${heated.id}`);
    await page.locator('qw-time-charts canvas').waitFor();
    await checkScreen(page, 'run-page-power-axis');
    for (const width of [1366, 390]) {
      await resizeTo(page, width, 844);
      await chartShot(page, 'qw-time-charts', `run-page-power-chart-${width}`);
    }
    // Readings as entered (°C, mA, with their digits), SI on demand.
    const table = page.locator('qw-readings-table');
    const firstTemperature = doc2Temperature();
    await table.getByRole('cell', { name: firstTemperature, exact: true }).first().waitFor();
    expect(await table.getByRole('columnheader').allTextContents()).toEqual(expect.arrayContaining(['Temperature (°C)', 'Heater current (mA)']));
    for (const width of [1366, 390]) {
      await resizeTo(page, width, 844);
      // At phone width the columns pass the screen's edge: a line says so (and the reading number stays put).
      const cue = table.getByText('Swipe the table sideways for the other columns →');
      // The cue follows the table's width once the resize lands, so both states are waited for.
      if (width === 390) await cue.waitFor();
      else await cue.waitFor({ state: 'detached', timeout: 5_000 });
      await chartShot(page, 'qw-readings-table', `run-page-readings-${width}`);
    }
    await table.getByRole('button', { name: 'Show in SI units' }).click();
    await table.getByRole('columnheader', { name: 'Temperature (K)' }).waitFor();
    await chartShot(page, 'qw-readings-table', 'run-page-readings-si-390');
  });
});

describe('a student assistant', () => {
  it('imports a logger file into a new draft and sees what is still missing', async () => {
    const { page } = s;
    await signInAs(page, 'assistant');
    await page.goto('/imports');
    await checkScreen(page, 'import-assistant');
    const csv = ['time_s,pressure_kPa,temperature_C', '0,101.3,21.0', '10,101.4,23.5', '20,101.3,26.1', '30,101.4,28.4'].join('\n');
    const preview = await api('POST', '/api/imports', undefined, { file: { name: 'bath-logger.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) } });
    const committed = await api('POST', `/api/imports/${preview.importId}/commit`, {
      mapping: { time: { index: 0, unit: 's' }, columns: [{ index: 1, channel: 'pressure', unit: 'kPa', reference: 'absolute' }, { index: 2, channel: 'temperature', unit: 'degC' }] },
      target: { newRun: { projectId: await projectId('GX'), title: `Logger import, e2e ${Date.now()}`, process: 'isobaric', runDate: '2026-03-14' } },
    });
    await page.goto(`/runs/${committed.runId}/edit`);
    const checklist = page.getByRole('region', { name: 'Still missing before you submit' });
    await checklist.waitFor({ timeout: 20_000 });
    // The gas was never chosen: the checklist says so in the form's words, without engine field paths.
    await checklist.getByText('Choose the gas, or an apparatus with a measured heat capacity for a calorimeter run.').waitFor();
    expect(await checklist.textContent()).not.toMatch(/gas\.model|"calorimeter"/);
    await checkScreen(page, 'import-checklist');

    // The same file with the gas, amount and ambient conditions chosen on import: the checklist no longer asks for the gas.
    const gases = (await api('GET', '/api/gases')).items as { id: number; code: string }[];
    const n2 = gases.find((g) => g.code === 'N2')!;
    const again = await api('POST', '/api/imports', undefined, { file: { name: 'bath-logger-2.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) } });
    const carried = await api('POST', `/api/imports/${again.importId}/commit`, {
      mapping: { time: { index: 0, unit: 's' }, columns: [{ index: 1, channel: 'pressure', unit: 'kPa', reference: 'absolute' }, { index: 2, channel: 'temperature', unit: 'degC' }] },
      target: { newRun: {
        projectId: await projectId('GX'), title: `Logger import with its setup, e2e ${Date.now()}`, process: 'isobaric', runDate: '2026-03-14', gasId: n2.id,
        setup: { gas: { model: 'species', species: 'N2' }, amount: { from: 'moles', value: 0.04 }, ambient: { pressure: { value: 1012.5, unit: 'hPa' }, temperature: { value: 21, unit: 'degC' } } },
      } },
    });
    await page.goto(`/runs/${carried.runId}/edit`);
    await checklist.waitFor({ timeout: 20_000 });
    expect(await checklist.textContent()).not.toContain('Choose the gas');
    await checkScreen(page, 'import-checklist-with-setup');
  });
});

describe('an investigator', () => {
  it('reads the why of a breaking demo run and its history in the audit trail by run code', async () => {
    const { page } = s;
    await signInAs(page, 'investigator');
    // The review tile counts exactly the list it opens: submitted runs written by others.
    const review = page.getByRole('link', { name: /Runs to review/ });
    const toReview = Number(await review.locator('.tile-count').textContent());
    await review.click();
    await page.getByText('Only runs written by others').waitFor();
    const listed = page.locator('tr.mat-mdc-row td.code a');
    if (toReview > 0) await listed.first().waitFor({ timeout: 20_000 });
    else await page.getByText('No runs match this filter.').waitFor({ timeout: 20_000 });
    expect(await listed.count()).toBe(Math.min(toReview, 25));
    await page.goto('/runs?verdict=breaks');
    await checkScreen(page, 'runs-breaks-investigator');
    await page.getByRole('link', { name: /^R-2026-/ }).first().click();
    await page.locator('qw-balance-card .why').waitFor({ timeout: 20_000 });
    expect(await page.locator('qw-balance-card .why').textContent()).toMatch(/^\s*\w+\s*Why: \S/);
    await checkScreen(page, 'run-page-investigator-why');
    const code = (await page.locator('h1 .code').textContent())!.trim();
    await page.goto(`/audit?run=${code}`);
    await page.getByRole('cell', { name: 'Checked the energy balance' }).first().waitFor({ timeout: 20_000 });
    expect(await page.getByRole('cell', { name: new RegExp(`Run ${code} rev\\. 1`) }).count()).toBeGreaterThan(0);
    await checkScreen(page, 'audit-by-run-investigator');
  });
});

describe('a quality officer', () => {
  it('reads audit rows in plain words, names and field-by-field changes, without the sign-ins', async () => {
    const { page } = s;
    await signInAs(page, 'quality');
    await page.goto('/audit?hideSignIns=true&entityType=run');
    const rows = page.locator('tr.mat-mdc-row:not(.detail-row)');
    await rows.first().waitFor({ timeout: 20_000 });
    expect(await page.getByRole('cell', { name: 'Signed in' }).count()).toBe(0);
    const created = rows.filter({ hasText: 'Created the run' }).first();
    await created.waitFor();
    expect(await created.textContent()).toMatch(/Lena Okonkwo|Mateo Brandt/);
    await created.getByRole('button', { name: /Show what event \d+ changed/ }).click();
    const changes = page.locator('table.changes').first();
    await changes.waitFor();
    expect(await changes.getByRole('rowheader', { name: 'State', exact: true }).count()).toBe(1);
    expect(await changes.textContent()).toContain('Draft');
    await checkScreen(page, 'audit-readable-quality');
    for (const [path, name] of [['/home', 'home-quality'], ['/instruments', 'instruments-quality'], ['/apparatus', 'apparatus-quality']] as const) {
      await page.goto(path);
      await checkScreen(page, name);
    }
    // The register form asks whether the rating is absolute or gauge.
    await page.goto('/apparatus');
    await page.getByRole('button', { name: 'Add apparatus' }).click();
    const form = await openedDialog(page);
    await form.getByText('The rating is').waitFor();
    for (const width of [1366, 390]) {
      await resizeTo(page, width, width === 390 ? 844 : 900);
      expect(await seriousViolations(page)).toEqual([]);
      await screenshot(page, `apparatus-form-reference-${width}`);
    }
    await resizeTo(page, 1366, 900);
    await page.keyboard.press('Escape');
    // The safety tile counts the runs over their rated pressure (the technician's CO₂ run above is one) and links to them.
    await page.goto('/home');
    const tile = page.getByRole('link', { name: /Runs above the rated pressure/ });
    const count = Number(await tile.locator('.tile-count').textContent());
    expect(count).toBeGreaterThan(0);
    expect(await tile.textContent()).toContain('Safety');
    await tile.click();
    await page.getByText('Only runs above the rated pressure').waitFor();
    const listed = page.locator('tr.mat-mdc-row td.code a');
    await listed.first().waitFor({ timeout: 20_000 });
    expect(await listed.count()).toBe(Math.min(count, 25));
    await checkScreen(page, 'runs-over-pressure-quality');
  });
});

describe('an administrator', () => {
  it.each([
    ['/people', 'people-admin'],
    ['/projects', 'projects-admin'],
    ['/gases', 'gases-admin'],
  ] as const)('%s has no serious accessibility violations', async (path, name) => {
    await signInAs(s.page, 'admin' as Role);
    await s.page.goto(path);
    await checkScreen(s.page, name);
  });
});

describe('signed out', () => {
  it('the sign-in page has no serious accessibility violations', async () => {
    await s.page.goto('/sign-in');
    await checkScreen(s.page, 'sign-in');
  });
});
