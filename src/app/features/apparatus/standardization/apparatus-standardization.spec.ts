import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';

import { Auth } from '../../../core/auth/auth';
import { Confirmation } from '../../../shared/confirmation/confirmation';
import { ApparatusStandardization } from './apparatus-standardization';
import { SeriesRun, StandardizationOverview } from './standardization.models';

// Invented demo values: six runs before a heater was replaced on 2026-03-10, two after.
const run = (i: number, value: number, segment: number, current: boolean): SeriesRun => ({
  runId: i, code: `R-2026-${String(i).padStart(4, '0')}`, runDate: `2026-03-${String(i + 1).padStart(2, '0')}`, state: 'submitted',
  energyEquivalent: { value, u: 4.137 }, accepted: current, outOfControl: false, rule: null, segment, current,
});
const limits = (centre: number, sigma: number) => ({ centre, sigma, lower: centre - 3 * sigma, upper: centre + 3 * sigma });
const overview: StandardizationOverview = {
  apparatus: { id: 3, tag: 'BC-1', name: 'Bath calorimeter BC-1', kind: 'bath-calorimeter' },
  current: {
    id: 1, energyEquivalent: { value: 4851.697, u: 4.556 }, heatLossCoefficient: { value: 0.1205034, u: 0.00042422 }, runIds: [1, 2, 3, 4, 5, 6],
    effectiveFrom: '2026-03-08', signedBy: 'Samir Castellanos', meaning: 'I have reviewed these standardization runs and approve the energy equivalent',
    reason: null, signedHash: 'x', signedAt: '2026-03-08T10:00:00Z',
  },
  due: { since: '2026-03-10', description: 'immersion heater replaced' },
  series: [...[4851.2, 4849.6, 4852.8, 4850.1, 4848.9, 4851.7].map((v, i) => run(i + 1, v, 0, false)), run(11, 4904.1, 1, true), run(12, 4906.3, 1, true)],
  chart: limits(4905.2, 1.95),
  segments: [
    { index: 0, change: null, n: 6, chart: limits(4850.7, 1.6), current: false },
    { index: 1, change: { date: '2026-03-10', description: 'immersion heater replaced' }, n: 2, chart: limits(4905.2, 1.95), current: true },
  ],
  summary: { n: 2, days: 2, mean: 4905.2, sd: 1.56, uMean: 1.1, rsd: 0.0003, acceptance: { ok: false, reasons: ['2 run(s); the lab\'s rule asks for at least 6'] } },
  rule: { minRuns: 6, minDays: 3, maxRsd: 0.005 },
  useFittedHeatLoss: false,
  history: [],
  changes: [],
};

describe('ApparatusStandardization', () => {
  let fixture: ComponentFixture<ApparatusStandardization>;
  let httpTesting: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([]), { provide: Auth, useValue: { role: signal('quality') } }],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ApparatusStandardization);
    fixture.componentRef.setInput('id', '3');
    fixture.detectChanges();
    httpTesting.expectOne('/api/apparatus/3/standardizations').flush(overview);
    await fixture.whenStable();
  });
  afterEach(() => httpTesting.verify());

  const text = () => (fixture.nativeElement as HTMLElement).textContent!.replace(/\s+/g, ' ');

  it('prints ε and the fitted h with u to two significant digits and the value to the same place (GUM 7.2.6)', () => {
    expect(text()).toContain('ε = 4851.7 ± 4.6 J/K');
    expect(text()).toContain('Fitted heat-loss coefficient h = 0.12050 ± 0.00042 W/K: shown only; runs use the h in the register');
    expect(text()).toContain('4904.1 ± 4.1');
  });

  it('says the chart restarted after the change and offers only the runs made since it', () => {
    expect(text()).toContain('The chart restarted after the change of 2026-03-10 (immersion heater replaced)');
    const boxes = [...(fixture.nativeElement as HTMLElement).querySelectorAll<HTMLInputElement>('table.series input[type=checkbox]')];
    expect(boxes.map((b) => b.disabled)).toEqual([true, true, true, true, true, true, false, false]);
    expect((fixture.nativeElement as HTMLElement).querySelectorAll('tr.earlier-row')).toHaveLength(6);
    const chart = (fixture.nativeElement as HTMLElement).querySelector('qw-control-chart canvas')!;
    expect(chart.getAttribute('aria-label')).toContain('centre 4905.2 J/K');
    expect(chart.getAttribute('aria-label')).toContain('6 earlier runs are shown as a previous segment');
  });

  it('signs the selected runs with the password and the fixed meaning, then confirms it visibly and reloads', async () => {
    const shown = jest.spyOn(TestBed.inject(Confirmation), 'show');
    const page = fixture.nativeElement as HTMLElement;
    const password = page.querySelector<HTMLInputElement>('input[type=password]')!;
    password.value = 'secret-pass';
    password.dispatchEvent(new Event('input'));
    fixture.detectChanges();
    [...page.querySelectorAll<HTMLButtonElement>('button')].find((b) => b.textContent?.includes('Sign standardization'))!.click();
    const req = httpTesting.expectOne({ method: 'POST', url: '/api/apparatus/3/standardizations' });
    expect(req.request.body).toEqual({ runIds: [11, 12], password: 'secret-pass', meaning: 'I have reviewed these standardization runs and approve the energy equivalent' });
    req.flush({ ...overview.current, id: 2, energyEquivalent: { value: 4905.2, u: 1.1 }, runIds: [11, 12] });
    httpTesting.expectOne('/api/apparatus/3/standardizations').flush(overview);
    await fixture.whenStable();
    expect(shown).toHaveBeenCalledWith('Standardization signed: ε = 4905.2 J/K from 2 runs.');
    expect(password.value).toBe('');
  });

  it('shows a refused signature in the shared problem banner, with the server\'s detail, and keeps the page', async () => {
    const page = fixture.nativeElement as HTMLElement;
    const password = page.querySelector<HTMLInputElement>('input[type=password]')!;
    password.value = 'secret-pass';
    password.dispatchEvent(new Event('input'));
    fixture.detectChanges();
    [...page.querySelectorAll<HTMLButtonElement>('button')].find((b) => b.textContent?.includes('Sign standardization'))!.click();
    const detail = "The selected runs do not meet the lab's acceptance rule: 2 run(s); the lab's rule asks for at least 6.";
    httpTesting.expectOne({ method: 'POST', url: '/api/apparatus/3/standardizations' }).flush(
      { type: 'about:blank', title: 'Bad request', status: 400, detail, errors: [{ field: 'runIds', message: "2 run(s); the lab's rule asks for at least 6" }] },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    const banner = page.querySelector('qw-problem-banner [role="alert"]');
    expect(banner?.querySelector('.problem-title')?.textContent?.trim()).toBe('Not saved.');
    expect(banner?.querySelector('.problem-detail')?.textContent?.trim()).toBe(detail);
    // The field message is already in the detail: said once
    expect(banner?.querySelectorAll('.problem-fields li')).toHaveLength(0);
    expect(page.querySelectorAll('[role="alert"]')).toHaveLength(1);
    expect(text()).toContain('ε = 4851.7 ± 4.6 J/K');
  });
});
