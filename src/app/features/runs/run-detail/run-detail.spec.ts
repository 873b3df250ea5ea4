import { LiveAnnouncer } from '@angular/cdk/a11y';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { routes } from '../../../app.routes';
import { Auth } from '../../../core/auth/auth';
import { Role } from '../../../core/auth/auth.models';
import { BalanceResponse, BalanceResult, RunRecord } from '../run-detail.models';

// Invented demo figures of the Harrowgate lab; only their display is under test here.
const run: RunRecord = {
  id: 2,
  code: 'R-2026-0002',
  revision: 1,
  previousRevisionId: null,
  revisionReason: null,
  projectId: 4,
  gasId: 1,
  apparatusId: 3,
  submittedAt: '2026-03-14T09:30:00Z',
  decidedAt: null,
  editedAt: '2026-03-14T09:20:00Z',
  createdAt: '2026-03-14T09:00:00Z',
  updatedAt: '2026-03-14T10:00:00Z',
  title: 'Rapid adiabatic expansion of dry air',
  process: 'adiabatic',
  state: 'submitted',
  version: 3,
  verdict: 'closes',
  runDate: '2026-03-14',
  returnReason: null,
  authorId: 1,
  authorName: 'Lena Okonkwo',
  projectName: 'Gas expansion, teaching lab 2',
  setup: {
    gas: { model: 'species', species: 'air' },
    channels: { pressure: { unit: 'kPa' }, temperature: { unit: 'K' } },
    apparatus: { name: 'Piston cell PC-3', ratedPressure: { value: 10, unit: 'bar' } },
  },
  readings: {
    count: 3,
    time: [0, 0.05, 0.1],
    pressure: [99510, 98350, 97220],
    volume: [null, null, null],
    displacement: [0.1, 0.10167, 0.10334],
    temperature: [300, 299.01, 298.02],
    voltage: [null, null, null],
    current: [null, null, null],
    power: [null, null, null],
  },
  series: { t: [0, 0.05, 0.1], P: [99510, 98350, 97220], V: [0.001, 0.00101, 0.00102], T: [300, 299.01, 298.02], power: null },
  balance: { id: 2, runVersion: 3, verdict: 'closes', en: 0.015, computedAt: '2026-03-14T10:00:00Z', stale: false },
  signatures: [],
  revisions: [{ id: 2, revision: 1, state: 'submitted', revisionReason: null, createdAt: '2026-03-14T09:00:00Z' }],
  // What the server offers a reviewing investigator of the project (server/runs/run-state-machine.ts).
  actions: ['approve', 'return', 'reject'],
  reviewNote: null,
};

const result = {
  engineVersion: '1.0.0',
  gas: 'air',
  process: { claimed: 'adiabatic', index: null },
  work: { measured: 60.49089, u: 0.1288, U: 0.2576, model: 60.569, modelFormula: '', gap: -0.078 },
  heat: { electrical: 0, leak: 0, wall: 0, total: 0, u: 0, U: 0 },
  internalEnergy: { value: -60.496888, u: 0.15174, U: 0.30347, method: 'n·∫Cv dT' },
  residual: { r: -0.005998, u: 0.19903, U: 0.39806, k: 2 },
  correlations: { W_Q: 0, W_dU: 0, Q_dU: 0 },
  En: 0.01507,
  verdict: 'closes',
  indeterminateLimit: 12.099,
  budget: [
    { source: 'pressure offset', group: 'PG-2', kind: 'systematic', distribution: 'rectangular', unit: 'Pa', u: 115.47, sensitivity: 0.001, contribution: 0.0135, share: 0.34 },
    { source: 'amount n', group: 'amount', kind: 'constant', distribution: 'normal', unit: 'mol', u: 0.0001, sensitivity: -1512, contribution: 0.0229, share: 0.58 },
  ],
  monteCarlo: null,
  polytropicFit: null,
  flags: [{ code: 'TIME_GAP', reading: 2, message: 'A gap of 5 s before this reading.' }],
  hints: [],
  temperatures: { T1: 300, T2: 227.11 },
  amount: { n: 0.04, source: 'given' },
  inputHash: 'abc',
} as unknown as BalanceResult;

const balance: BalanceResponse = { id: 2, runId: 2, runVersion: 3, currentRunVersion: 3, stale: false, computedAt: '2026-03-14T10:00:00Z', result, why: null };

describe('RunDetail', () => {
  // The first test compiles the lazy run page and its charts; on a busy 2-core machine that can pass 5 s.
  jest.setTimeout(20_000);

  let httpTesting: HttpTestingController;
  let harness: RouterTestingHarness;

  async function openAs(role: Role, personId: number): Promise<void> {
    TestBed.configureTestingModule({
      providers: [provideRouter(routes), provideHttpClient(), provideHttpClientTesting()],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    TestBed.inject(Auth).restore().subscribe();
    httpTesting.expectOne('/api/auth/me').flush({ person: { id: personId, email: `${role}@lab.test`, name: 'Someone', role } });
    harness = await RouterTestingHarness.create();
    await harness.navigateByUrl('/runs/2');
  }

  async function answer(withBalance: boolean, read: RunRecord = run): Promise<void> {
    httpTesting.expectOne('/api/runs/2').flush(read);
    const balanceRequest = httpTesting.expectOne('/api/runs/2/balance');
    if (withBalance) {
      balanceRequest.flush(balance);
    } else {
      balanceRequest.flush(
        { title: 'Not found', status: 404, detail: 'Run R-2026-0002 is being checked; its result appears here shortly.' },
        { status: 404, statusText: 'Not Found' },
      );
    }
    httpTesting.expectOne('/api/runs/2/history').flush({ items: [] });
    await harness.fixture.whenStable();
  }

  afterEach(() => httpTesting.verify());

  const page = () => harness.fixture.nativeElement as HTMLElement;
  const buttons = () => Array.from(page().querySelectorAll('button')).map((button) => button.textContent?.trim() ?? '');

  it('shows the summary, the verdict as icon and word, and ΔU beside Q − W as x ± U', async () => {
    await openAs('investigator', 3);
    await answer(true);

    expect(page().querySelector('h1')?.textContent).toContain('R-2026-0002');
    expect(page().querySelector('h1')?.textContent).toContain('Rapid adiabatic expansion of dry air');
    const summary = page().querySelector('.summary')?.textContent ?? '';
    for (const part of ['Submitted', 'adiabatic', 'Lena Okonkwo', 'Gas expansion, teaching lab 2', '14 Mar 2026']) {
      expect(summary).toContain(part);
    }
    const card = page().querySelector('qw-balance-card') as HTMLElement;
    expect(card.querySelector('qw-verdict-display')?.textContent).toContain('Closes');
    expect(card.querySelector('qw-verdict-display mat-icon')?.textContent?.trim()).toBe('check_circle');
    expect(card.textContent).toContain('\u221260.50 ± 0.30 J (k = 2)');
    expect(card.textContent).toContain('\u221260.49 ± 0.26 J (k = 2)');
    expect(card.textContent).toContain('\u22120.01 ± 0.40 J (k = 2)');
  });

  it('lists the budget largest share first, and cautions about the rated pressure', async () => {
    await openAs('investigator', 3);
    await answer(true);

    const sources = Array.from(page().querySelectorAll('qw-budget-table tr.mat-mdc-row td:first-child')).map((cell) => cell.textContent?.trim());
    expect(sources).toEqual(['amount n', 'pressure offset']);
    expect(page().querySelector('qw-budget-table')?.textContent).toContain('58.0 %');
    expect(page().querySelector('aside.safety')?.textContent?.replace(/\s+/g, ' ')).toContain('rated pressure of 10 bar');
    expect(buttons()).toContain('Show reading 2');
  });

  it('shows readings above the rated pressure as a safety alert of its own, deferring to local codes', async () => {
    await openAs('investigator', 3);
    expect(page().querySelector('.pressure-alert')).toBeNull();
    const over = {
      ...result,
      flags: [
        { code: 'ABOVE_RATED_PRESSURE', reading: 2, message: "Reading 2 reaches 1050 kPa absolute, above the vessel's rated 10 bar absolute; stay within the vessel's rating and the lab's safety review." },
        { code: 'ABOVE_RATED_PRESSURE', reading: 3, message: "Reading 3 reaches 1020 kPa absolute, above the vessel's rated 10 bar absolute; stay within the vessel's rating and the lab's safety review." },
      ],
    } as BalanceResult;
    httpTesting.expectOne('/api/runs/2').flush(run);
    httpTesting.expectOne('/api/runs/2/balance').flush({ ...balance, result: over });
    httpTesting.expectOne('/api/runs/2/history').flush({ items: [] });
    await harness.fixture.whenStable();

    const alert = page().querySelector('aside.pressure-alert[role="alert"]');
    const text = alert?.textContent?.replace(/\s+/g, ' ') ?? '';
    expect(text).toContain('Safety alert: above the rated pressure');
    expect(text).toContain('2 readings of this run went above the rated pressure of Piston cell PC-3');
    expect(text).toContain("Reading 2 reaches 1050 kPa absolute, above the vessel's rated 10 bar absolute.");
    // said once, in kPa: neither the SI figures nor the flag's closing advice beside the alert's own
    expect(text).not.toMatch(/\d Pa\b/);
    expect(text).not.toContain("stay within the vessel's rating");
    expect(text).toContain("Local codes and the lab's licensed safety practice take precedence");
    // it is not the ordinary caution banner
    expect(alert?.classList.contains('safety')).toBe(false);
  });

  const actionButtons = () => [
    ...buttons().filter((text) => /Approve|Reject|Return for correction|Correct this run/.test(text)),
    ...Array.from(page().querySelectorAll('.actions a')).map((link) => link.textContent?.trim() ?? '').filter((text) => /Edit/.test(text)),
  ];

  it('offers approve, return and reject when the server lists them', async () => {
    await openAs('investigator', 3);
    await answer(true);

    expect(actionButtons()).toEqual(['verified Approve', 'undo Return for correction', 'block Reject']);
  });

  it('shows no review to the author, and the reason the server gives', async () => {
    await openAs('investigator', 1);
    await answer(true, { ...run, actions: [], reviewNote: 'You wrote this run, so another investigator of the project reviews it.' });

    expect(actionButtons()).toEqual([]);
    expect(page().textContent).toContain('You wrote this run, so another investigator of the project reviews it.');
  });

  it('shows exactly the actions the server lists, whatever the role says', async () => {
    await openAs('technician', 1);
    await answer(true, { ...run, state: 'returned', actions: ['edit', 'submit'] });
    expect(actionButtons()).toEqual(['edit Edit']);
  });

  it('offers the correction of an approved run when the server lists it', async () => {
    await openAs('assistant', 9);
    await answer(true, { ...run, state: 'approved', actions: ['correct'] });
    expect(actionButtons()).toEqual(['edit_document Correct this run']);
  });

  it("says the run is being checked when /balance answers 404, and offers no review", async () => {
    await openAs('investigator', 3);
    await answer(false, { ...run, actions: [], reviewNote: 'The review opens once the balance check has stored its result for this version of the run.' });

    expect(page().textContent).toContain('Run R-2026-0002 is being checked; its result appears here shortly.');
    expect(page().querySelector('qw-balance-card')).toBeNull();
    expect(buttons().some((text) => /Approve/.test(text))).toBe(false);
    // Waiting for a result is not a failure: no problem banner
    expect(page().querySelector('qw-problem-banner [role="alert"]')).toBeNull();
  });

  it('shows a balance that failed to load in the shared problem banner, beside the run it did load', async () => {
    await openAs('investigator', 3);
    httpTesting.expectOne('/api/runs/2').flush(run);
    const detail = 'Something went wrong on the server. Try again; if it keeps happening, tell your administrator.';
    httpTesting.expectOne('/api/runs/2/balance').flush({ title: 'Server error', status: 500, detail }, { status: 500, statusText: 'Internal Server Error' });
    httpTesting.expectOne('/api/runs/2/history').flush({ items: [] });
    await harness.fixture.whenStable();

    const banner = page().querySelector('qw-problem-banner [role="alert"]');
    expect(banner?.querySelector('.problem-title')?.textContent?.trim()).toBe('The balance result could not be loaded.');
    expect(banner?.querySelector('.problem-detail')?.textContent?.trim()).toBe(detail);
    expect(page().querySelector('h1')?.textContent).toContain('R-2026-0002');
  });

  it('asks again while the check runs, shows the verdict and its why without a reload, and announces it', async () => {
    jest.useFakeTimers({ advanceTimers: true });
    try {
      await openAs('investigator', 3);
      const announce = jest.spyOn(TestBed.inject(LiveAnnouncer), 'announce').mockResolvedValue();
      const checking = { ...run, verdict: null, balance: null, actions: [], reviewNote: 'The review opens once the balance check has stored its result for this version of the run.' };
      httpTesting.expectOne('/api/runs/2').flush(checking);
      httpTesting
        .expectOne('/api/runs/2/balance')
        .flush({ title: 'Not found', status: 404, detail: 'Run R-2026-0002 is being checked.' }, { status: 404, statusText: 'Not Found' });
      httpTesting.expectOne('/api/runs/2/history').flush({ items: [] });
      await harness.fixture.whenStable();
      expect(page().querySelector('qw-balance-card')).toBeNull();

      // The first poll comes after one second; nothing is asked before.
      jest.advanceTimersByTime(900);
      httpTesting.expectNone('/api/runs/2/balance');
      jest.advanceTimersByTime(100);
      const why = 'U(r) = 30 J is wider than the lab\'s limit of 12 J, mostly from PG-2 (80 % of u²(r)).';
      httpTesting.expectOne('/api/runs/2').flush({ ...run, verdict: 'indeterminate' });
      httpTesting.expectOne('/api/runs/2/balance').flush({ ...balance, result: { ...result, verdict: 'indeterminate' }, why });
      httpTesting.expectOne('/api/runs/2/history').flush({ items: [] });
      await harness.fixture.whenStable();

      expect(page().querySelector('qw-balance-card qw-verdict-display')?.textContent).toContain('Indeterminate');
      expect(page().querySelector('qw-balance-card .why')?.textContent).toContain(why);
      expect(announce).toHaveBeenCalledWith(expect.stringContaining('The balance check of run R-2026-0002 has finished: Indeterminate'), 'polite');
      // Once the result is there, nothing more is asked.
      jest.advanceTimersByTime(60_000);
      httpTesting.expectNone('/api/runs/2/balance');
    } finally {
      jest.useRealTimers();
    }
  });
});
