// A calorimeter's standardization end to end. The six electrical standardization runs and the two later
// calorimetric runs are created and submitted through the API with the technician's own session (the entry form
// has no standardization fields yet); the key steps are done in the browser: the quality officer signs the
// standardization on the apparatus page and records a repair there, and the run pages and the investigator's
// home show what follows.
import type { APIRequestContext, Locator, Page } from 'playwright-core';
import { seriousViolations } from './support/axe';
import { demoStandardizationReadings } from '../db/seed/demo-standardizations';
import { join } from 'node:path';
import { openBrowser, screenshot, SCREENSHOT_DIR, type Session } from './support/browser';
import { signInAs } from './support/sign-in';
import { resizeTo } from './support/viewport';
import { until } from './support/wait';
import { DEFAULT_DEMO_PASSWORD } from '../db/seed/demo-lab';

const sessions: Session[] = [];
afterAll(async () => {
  for (const s of sessions) await s.close();
});

async function sessionAs(role: 'technician' | 'quality' | 'investigator'): Promise<Session> {
  const s = await openBrowser();
  sessions.push(s);
  await signInAs(s.page, role);
  return s;
}

/** JSON API call with the page's cookies and its CSRF token, as the app itself sends it. */
async function api(page: Page, method: 'GET' | 'POST' | 'PUT', path: string, data?: unknown) {
  const cookies = await page.context().cookies();
  const xsrf = cookies.find((c) => c.name === 'XSRF-TOKEN')?.value ?? '';
  const req: APIRequestContext = page.request;
  const res = await req.fetch(path, { method, data, headers: { 'x-xsrf-token': xsrf } });
  const body = res.headers()['content-type']?.includes('json') ? await res.json() : null;
  if (res.status() >= 400) throw new Error(`${method} ${path}: ${res.status()} ${JSON.stringify(body)}`);
  return body;
}

/**
 * Screenshots at the two widths the screens are checked at, with no serious accessibility violation; the page
 * scrolls inside its own container, so `focus` is scrolled into view first. Waits for the resize to land (the
 * navigation in its mode for the width, its slide ended): the slide starts a render after the resize, so
 * animations looked for at once may not have started yet.
 */
async function screens(page: Page, name: string, focus?: Locator): Promise<void> {
  for (const width of [1366, 390]) {
    await resizeTo(page, width, width === 390 ? 844 : 900);
    const violations = await seriousViolations(page);
    expect({ screen: name, width, violations }).toEqual({ screen: name, width, violations: [] });
    if (focus) await focus.scrollIntoViewIfNeeded();
    await screenshot(page, `${name}-${width}`);
  }
  await resizeTo(page, 1280, 800);
}

const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);

async function waitForResult(page: Page, runId: number) {
  for (let i = 0; i < 120; i++) {
    try {
      return (await api(page, 'GET', `/api/runs/${runId}/balance`)).result;
    } catch {
      await page.waitForTimeout(500);
    }
  }
  throw new Error(`run ${runId} got no balance result`);
}

describe('standardizing a bath calorimeter', () => {
  it('six runs over three days, a signed standardization, a run that uses it, and a repair that flags the next run', async () => {
    const quality = await sessionAs('quality');
    const technician = await sessionAs('technician');
    // The demo bath calorimeter's history: its chart marks the one out-of-control run.
    const bc1 = ((await api(quality.page, 'GET', '/api/apparatus')).items as Array<{ id: number; tag: string }>).find((a) => a.tag === 'BC-1')!;
    await quality.page.goto(`/apparatus/${bc1.id}`);
    await quality.page.getByRole('img', { name: /out of control: R-\d{4}-\d{4}/ }).waitFor();
    await screens(quality.page, 'apparatus-bc1-control-chart', quality.page.getByRole('heading', { name: 'Control chart' }));
    // Values with their standard uncertainty, u to two significant digits (GUM 7.2.6), never "± 0.000".
    const inForce = await quality.page.getByText(/Fitted heat-loss coefficient h = /).textContent();
    expect(inForce).toMatch(/h = \d+\.\d+ ± 0\.0*[1-9]\d? W\/K/);
    // The entry form offers a standardization run with its heat source.
    await technician.page.goto('/runs/new');
    await technician.page.getByRole('radio', { name: 'Calorimeter (no gas)' }).check();
    await technician.page.getByRole('radio', { name: /Standardization run/ }).check();
    await technician.page.getByRole('radio', { name: 'Reference material' }).check();
    // The field appears with the choice and is filled in by the form: its value is waited for, then checked.
    const massic = technician.page.getByLabel('Certified massic energy (J/g)');
    expect(await until(() => massic.inputValue(), (v) => v !== '')).toBe('26434');
    await technician.page.getByLabel('Certified massic energy (J/g)').scrollIntoViewIfNeeded();
    await screenshot(technician.page, 'run-entry-standardization');
    const tag = `BC-E${Date.now().toString(36).toUpperCase().slice(-4)}`;
    const app = await api(quality.page, 'POST', '/api/apparatus', { tag, name: `Bath calorimeter ${tag}`, kind: 'bath-calorimeter', heatCapacity: 4850, heatCapacityU: 12, heatLossCoefficient: 0.12, heatLossCoefficientU: 0.02 });
    const instruments = (await api(technician.page, 'GET', '/api/instruments')).items as Array<{ id: number; tag: string }>;
    const inst = (t: string) => instruments.find((i) => i.tag === t)!.id;
    const projects = (await api(technician.page, 'GET', '/api/projects')).items as Array<{ id: number; code: string }>;
    const projectId = projects.find((p) => p.code === 'CB')!.id;

    const record = async (runDate: string, purpose: 'standardization' | 'measurement', seed: number) => {
      const r = demoStandardizationReadings(4852 * (1 + 0.0004 * Math.sin(seed)), seed);
      const setup = {
        gas: { model: 'calorimeter' }, ambient: { temperature: { value: 21, unit: 'degC', u: 0.1 } },
        ...(purpose === 'standardization' ? { purpose, heatSource: { kind: 'electrical' } } : {}),
      };
      const run = await api(technician.page, 'POST', '/api/runs', { projectId, title: `${purpose === 'standardization' ? 'Electrical standardization' : 'Heat-capacity run'} of ${tag}, ${runDate}`, process: 'calorimetric', runDate, apparatusId: app.id, setup });
      const filled = await api(technician.page, 'PUT', `/api/runs/${run.id}/readings`, {
        version: run.version, time: { unit: 's', values: r.t },
        channels: { temperature: { unit: 'degC', instrumentId: inst('TC-9'), values: r.T }, voltage: { unit: 'V', instrumentId: inst('DV-4'), values: r.U }, current: { unit: 'A', instrumentId: inst('DA-5'), values: r.I } },
      });
      await api(technician.page, 'POST', `/api/runs/${run.id}/submit`, { version: filled.version });
      return run.id as number;
    };

    // Six electrical standardization runs over three days (ASTM D240 §8.1: at least six over at least three days).
    const ids: number[] = [];
    for (const [i, offset] of [-2, -2, -1, -1, 0, 0].entries()) ids.push(await record(day(offset), 'standardization', 100 + i));
    for (const id of ids) expect((await waitForResult(technician.page, id)).energyEquivalent.value).toBeGreaterThan(4700);

    // The quality officer signs the standardization on the apparatus page.
    const q = quality.page;
    await q.goto(`/apparatus/${app.id}`);
    await q.getByRole('heading', { level: 1, name: new RegExp(tag) }).waitFor();
    await q.getByRole('img', { name: /Control chart of the energy equivalent of 6 runs/ }).waitFor();
    await q.getByLabel('Your password').fill(DEFAULT_DEMO_PASSWORD);
    await q.getByRole('button', { name: 'Sign standardization' }).click();
    await q.getByText(/in force from .*signed by Samir Castellanos/).waitFor();
    await screens(q, 'standardization-signed', q.getByRole('heading', { name: 'Standardization in force' }));
    const overview = await api(q, 'GET', `/api/apparatus/${app.id}/standardizations`);
    expect(overview.current.runIds.sort()).toEqual([...ids].sort());

    // A later calorimetric run on the apparatus uses it, and its result says so.
    const later = await record(day(0), 'measurement', 7);
    const used = await waitForResult(technician.page, later);
    expect(used.standardization.id).toBe(overview.current.id);
    expect(used.flags.map((f: { code: string }) => f.code)).not.toContain('STANDARDIZATION_DUE');
    await technician.page.goto(`/runs/${later}`);
    await technician.page.getByText('Standardization used').waitFor();
    // The corrected rise is drawn on the run's one temperature chart: periods shaded, drift lines, ΔT_c marked.
    const chart = technician.page.getByRole('img', { name: /fore-period to \d+ s, main period to \d+ s.*corrected rise is marked: corrected rise [\d.]+ ± [\d.]+ K/ });
    await chart.waitFor();
    expect(await technician.page.locator('qw-time-charts').count()).toBe(1);
    await screens(technician.page, 'run-corrected-rise', technician.page.getByRole('heading', { name: 'Corrected temperature rise' }));
    for (const width of [1366, 390]) {
      await resizeTo(technician.page, width, 844);
      await chart.scrollIntoViewIfNeeded();
      await chart.screenshot({ path: join(SCREENSHOT_DIR, `run-temperature-chart-rise-${width}.png`) });
    }
    await resizeTo(technician.page, 1280, 800);

    // A repair recorded by the quality officer makes the next run flagged.
    await q.getByLabel('What was changed').fill('Immersion heater replaced after a repair');
    await q.getByRole('button', { name: 'Record change' }).click();
    await q.getByText(/Standardization due\./).waitFor();
    // The chart restarts after the change: the six runs become a previous segment (ASTM D240 §8.1.1).
    await q.getByText(/The chart restarted after the change of/).waitFor();
    await q.getByRole('img', { name: /The chart restarted after the change of .*6 earlier runs are shown as a previous segment/ }).waitFor();
    await screens(q, 'apparatus-after-change', q.getByRole('heading', { name: 'Control chart' }));
    const next = await record(day(0), 'measurement', 8);
    const flagged = await waitForResult(technician.page, next);
    expect(flagged.flags.find((f: { code: string }) => f.code === 'STANDARDIZATION_DUE')?.message).toMatch(/Immersion heater replaced after a repair/);

    // The investigator's home lists the apparatus as due.
    const investigator = await sessionAs('investigator');
    await investigator.page.getByRole('heading', { name: /Standardization due/ }).waitFor();
    await investigator.page.getByRole('link', { name: new RegExp(tag) }).waitFor();
    await screenshot(investigator.page, 'home-standardization-due');
  }, 240_000);
});
