import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { By } from '@angular/platform-browser';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { routes } from '../../../app.routes';
import { Auth } from '../../../core/auth/auth';
import { RunEntry } from './run-entry';

describe('RunEntry page', () => {
  // Each test drives the whole form through harnesses; on a busy two-core machine that can pass 5 s.
  jest.setTimeout(20_000);
  let http: HttpTestingController;
  let harness: RouterTestingHarness;
  let root: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideRouter(routes), provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    TestBed.inject(Auth).restore().subscribe();
    http
      .expectOne('/api/auth/me')
      .flush({ person: { id: 1, email: 'technician@lab.test', name: 'Lee Park', role: 'technician' } });
    harness = await RouterTestingHarness.create();
    await harness.navigateByUrl('/runs/new');
    http.expectOne('/api/projects').flush({ items: [{ id: 4, code: 'GX', name: 'Gas expansion' }] });
    http.expectOne('/api/gases').flush({ items: [{ id: 3, code: 'Ar', name: 'Argon', molarMass: 0.039948 }] });
    http.expectOne('/api/apparatus').flush({
      items: [{ id: 1, tag: 'PC-3', name: 'Piston cell PC-3', kind: 'piston-cell', ratedPressure: 1e6, bore: 0.05, fixedVolume: null }],
    });
    http.expectOne('/api/instruments').flush({ items: [] });
    await harness.fixture.whenStable();
    root = harness.fixture.nativeElement as HTMLElement;
    // The first compile of the page and its Material parts is slow on a small machine.
  }, 20_000);

  afterEach(() => {
    // The draft's checklist, asked after saves; its own spec checks it.
    http
      .match((request) => request.url.endsWith('/checklist'))
      .filter((request) => !request.cancelled)
      .forEach((request) => request.flush({ complete: true, missing: [] }));
    http.verify();
  });

  function page(): RunEntry {
    return harness.fixture.debugElement.query(By.directive(RunEntry)).componentInstance as RunEntry;
  }

  /** Fills what a first save needs and one channel, then types two readings. */
  async function fillRun(): Promise<void> {
    page()['form'].patchValue({ title: 'Argon, isochoric heating', process: 'isochoric', gasId: 3, moles: 0.05 });
    page()['form'].controls.channels.controls.temperature.controls.enabled.setValue(true);
    await harness.fixture.whenStable();
    const cells = ['0', '21.5', '10', '23.0'];
    const inputs = Array.from(root.querySelectorAll<HTMLInputElement>('qw-readings-grid input.cell')).slice(0, 4);
    inputs.forEach((input, i) => {
      input.value = cells[i];
      input.dispatchEvent(new Event('input', { bubbles: true }));
    });
    await harness.fixture.whenStable();
  }

  async function submit(): Promise<void> {
    root.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    await harness.fixture.whenStable();
  }

  async function settle(): Promise<void> {
    for (let i = 0; i < 10; i++) {
      await Promise.resolve();
    }
    await harness.fixture.whenStable();
  }

  it('names the page, chooses the only project, and labels grid cells by reading and unit', async () => {
    expect(root.querySelector('h1')?.textContent?.trim()).toBe('New run');
    expect(page()['form'].controls.projectId.value).toBe(4);
    page()['form'].controls.channels.controls.pressure.controls.enabled.setValue(true);
    await harness.fixture.whenStable();
    expect(root.querySelector('input[data-row="0"][data-col="1"]')?.getAttribute('aria-label')).toBe('Reading 1, pressure in kPa');
  });

  it('warns beside the grid once a pressure reading, in any unit, passes 90 % of the apparatus rating', async () => {
    page()['form'].patchValue({ apparatusId: 1 });
    page()['form'].controls.channels.controls.pressure.patchValue({ enabled: true, unit: 'bar' });
    await harness.fixture.whenStable();
    const pressure = root.querySelector<HTMLInputElement>('input[data-row="0"][data-col="1"]')!;
    expect(root.querySelector('qw-safety-notices [role="note"]')?.textContent).toContain('Piston cell PC-3: 1,000 kPa (10 bar)');

    pressure.value = '8.9';
    pressure.dispatchEvent(new Event('input', { bubbles: true }));
    await harness.fixture.whenStable();
    expect(root.querySelector('qw-safety-notices [role="alert"]')).toBeNull();

    pressure.value = '9.5';
    pressure.dispatchEvent(new Event('input', { bubbles: true }));
    await harness.fixture.whenStable();
    expect(root.querySelector('qw-safety-notices [role="alert"]')?.textContent).toContain('950 kPa absolute is 95 % of the rated pressure');
  });

  it('saves the draft before submitting, then lists each problem the server found as a sentence', async () => {
    await fillRun();
    await submit();

    const post = http.expectOne({ method: 'POST', url: '/api/runs' });
    expect(post.request.body).toMatchObject({ projectId: 4, title: 'Argon, isochoric heating', process: 'isochoric', gasId: 3 });
    post.flush({ id: 12, code: 'R-2026-0012', version: 1 });
    await settle();
    const put = http.expectOne({ method: 'PUT', url: '/api/runs/12/readings' });
    expect(put.request.body).toEqual({
      version: 1,
      time: { unit: 's', values: [0, 10] },
      // Typed "21.5" and "23.0": one decimal, which the run page shows them back with.
      channels: { temperature: { unit: 'degC', decimals: 1, values: [21.5, 23] } },
    });
    put.flush({ id: 12, version: 2, readings: 2 });
    await settle();
    const submitted = http.expectOne({ method: 'POST', url: '/api/runs/12/submit' });
    expect(submitted.request.body).toEqual({ version: 2 });
    submitted.flush(
      {
        title: 'Bad request',
        status: 400,
        detail: 'Run R-2026-0012 is not complete enough to check: 2 problem(s). Nothing was changed.',
        errors: [
          { field: 'apparatus.vesselVolume', message: 'is required for an isochoric run' },
          { field: 'readings.power', message: 'is required (or voltage and current)' },
        ],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await settle();

    const alert = root.querySelector('qw-problem-banner [role="alert"]');
    expect(alert?.querySelector('.problem-title')?.textContent?.trim()).toBe('Not submitted.');
    expect(alert?.textContent).toContain('not complete enough to check');
    expect(Array.from(alert?.querySelectorAll('li') ?? []).map((li) => li.textContent?.trim())).toEqual([
      'The apparatus vessel volume is required for an isochoric run.',
      'The heater power column is required (or voltage and current).',
    ]);
    expect(TestBed.inject(Router).url).toBe('/runs/new');
  });

  it('opens the run page once the server takes the run', async () => {
    await fillRun();
    await submit();
    http.expectOne({ method: 'POST', url: '/api/runs' }).flush({ id: 12, code: 'R-2026-0012', version: 1 });
    await settle();
    http.expectOne({ method: 'PUT', url: '/api/runs/12/readings' }).flush({ id: 12, version: 2, readings: 2 });
    await settle();
    http.expectOne({ method: 'POST', url: '/api/runs/12/submit' }).flush({ id: 12, version: 3 }, { status: 202, statusText: 'Accepted' });
    await settle();

    expect(TestBed.inject(Router).url).toBe('/runs/12');
    // The run page (built elsewhere) loads its own data; this spec only follows the hand-over.
    http.match(() => true);
  });

  it('stops on a version conflict and offers to reload the run, never merging', async () => {
    await fillRun();
    await submit();
    http.expectOne({ method: 'POST', url: '/api/runs' }).flush({ id: 12, code: 'R-2026-0012', version: 1 });
    await settle();
    const detail = 'Run R-2026-0012 was changed by someone else since you opened it. Reload the run, check the changes and make your edit again.';
    http
      .expectOne({ method: 'PUT', url: '/api/runs/12/readings' })
      .flush({ title: 'Conflict', status: 409, detail, currentVersion: 3 }, { status: 409, statusText: 'Conflict' });
    await settle();

    const banner = root.querySelector('qw-problem-banner [role="alert"]');
    expect(banner?.querySelector('.problem-title')?.textContent?.trim()).toBe('Autosave stopped.');
    expect(banner?.querySelector('.problem-detail')?.textContent?.trim()).toBe(detail);
    expect(banner?.querySelector('mat-icon')?.textContent?.trim()).toBe('sync_problem');
    expect(banner?.querySelector('button.problem-retry')?.textContent?.trim()).toBe('Reload the run');
    expect(root.querySelector<HTMLButtonElement>('button[type="submit"]')?.disabled).toBe(true);
    http.expectNone({ method: 'POST', url: '/api/runs/12/submit' });

    Array.from(banner!.querySelectorAll('button')).find((b) => b.textContent?.includes('Reload the run'))!.click();
    http.expectOne({ method: 'GET', url: '/api/runs/12' }).flush({
      id: 12, code: 'R-2026-0012', projectId: 4, title: 'Argon, heated by someone else', process: 'isochoric', state: 'draft',
      runDate: '2026-11-30', gasId: 3, apparatusId: null, version: 3,
      setup: { gas: { model: 'species', species: 'Ar' }, channels: { temperature: { unit: 'K' } } },
      readings: { count: 1, time: [0], temperature: [300], pressure: [null], volume: [null], displacement: [null], voltage: [null], current: [null], power: [null] },
    });
    await settle();

    expect(root.textContent).not.toContain('Autosave stopped');
    expect(page()['form'].controls.title.value).toBe('Argon, heated by someone else');
    expect(root.querySelector<HTMLInputElement>('input[data-row="0"][data-col="1"]')?.value).toBe('300');
  });
});
