import { LiveAnnouncer } from '@angular/cdk/a11y';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { routes } from '../../../app.routes';
import { Auth } from '../../../core/auth/auth';
import { RunPage } from '../runs.models';

const page: RunPage = {
  items: [
    {
      id: 7,
      code: 'R-0007',
      revision: 1,
      title: 'Argon, isothermal compression',
      process: 'isothermal',
      state: 'submitted',
      verdict: 'breaks',
      runDate: '2026-11-30',
      authorId: 3,
      authorName: 'Lee Park',
      projectId: 2,
      projectName: 'Gas laws lab',
      updatedAt: '2026-11-30T09:15:00Z',
    },
  ],
  total: 60,
  page: 2,
  pageSize: 25,
};

describe('RunList', () => {
  let httpTesting: HttpTestingController;
  let harness: RouterTestingHarness;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideRouter(routes), provideHttpClient(), provideHttpClientTesting()],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    TestBed.inject(Auth).restore().subscribe();
    httpTesting
      .expectOne('/api/auth/me')
      .flush({ person: { id: 3, email: 'investigator@lab.test', name: 'Dana Ortiz', role: 'investigator' } });
    harness = await RouterTestingHarness.create();
  });

  afterEach(() => {
    // The project and author filters' choices.
    httpTesting.match('/api/projects').forEach((request) => request.flush({ items: [] }));
    httpTesting.verify();
  });

  it('passes on the filters of the home tiles (mine, verdict) and the project, author and date filters', async () => {
    await harness.navigateByUrl('/runs?state=submitted&verdict=breaks&mine=true&project=2&author=5&from=2026-01-01&to=2026-03-31');
    const params = expectList().request.params;
    expect(['state', 'verdict', 'mine', 'project', 'author', 'from', 'to'].map((k) => params.get(k))).toEqual([
      'submitted', 'breaks', 'true', '2', '5', '2026-01-01', '2026-03-31',
    ]);
  });

  it("passes on the reviewer's and the safety tiles' filters (others, safety) and shows each as a box to clear", async () => {
    await harness.navigateByUrl('/runs?state=submitted&others=true&safety=over-pressure');
    const params = expectList().request.params;
    expect(['state', 'others', 'safety'].map((k) => params.get(k))).toEqual(['submitted', 'true', 'over-pressure']);
    const text = (harness.routeNativeElement as HTMLElement).textContent ?? '';
    expect(text).toContain('Only runs written by others');
    expect(text).toContain('Only runs above the rated pressure');
  });

  it('leaves out filters that are garbled: a bad verdict, a non-numeric project, a date that is not a date', async () => {
    await harness.navigateByUrl('/runs?verdict=great&project=abc&from=yesterday&mine=yes&safety=hot');
    const params = expectList().request.params;
    expect(['verdict', 'project', 'from', 'mine', 'safety'].map((k) => params.has(k))).toEqual([false, false, false, false, false]);
  });

  it('re-reads the page quietly while a submitted run waits for its check, and announces the verdict when it comes', async () => {
    jest.useFakeTimers({ advanceTimers: true });
    try {
      const announce = jest.spyOn(TestBed.inject(LiveAnnouncer), 'announce').mockResolvedValue();
      await harness.navigateByUrl('/runs?state=submitted');
      const waiting = { ...page, items: [{ ...page.items[0], verdict: null }] };
      expectList().flush(waiting);
      await harness.fixture.whenStable();
      expect(harness.fixture.nativeElement.querySelector('td qw-verdict-display')?.textContent).toContain('Not checked');

      jest.advanceTimersByTime(1000);
      expectList().flush(waiting);
      await harness.fixture.whenStable();
      // The wait doubles after an empty answer.
      jest.advanceTimersByTime(1900);
      httpTesting.expectNone((request) => request.url === '/api/runs');
      jest.advanceTimersByTime(100);
      const request = expectList();
      expect(request.request.params.get('state')).toBe('submitted');
      request.flush(page);
      await harness.fixture.whenStable();

      expect(harness.fixture.nativeElement.querySelector('td qw-verdict-display')?.textContent).toContain('Breaks');
      expect(announce).toHaveBeenCalledWith('Balance check finished for R-0007: Breaks.', 'polite');
      jest.advanceTimersByTime(60_000);
      httpTesting.expectNone((request) => request.url === '/api/runs');
    } finally {
      jest.useRealTimers();
    }
  });

  it('names the verdicts in the balance filter in words', async () => {
    await harness.navigateByUrl('/runs');
    expectList().flush(page);
    await harness.fixture.whenStable();
    const triggers = harness.fixture.nativeElement.querySelectorAll('mat-select .mat-mdc-select-trigger') as NodeListOf<HTMLElement>;
    triggers[1].click();
    await harness.fixture.whenStable();
    const options = Array.from(document.querySelectorAll('mat-option')).map((o) => o.textContent?.trim());
    expect(options).toEqual(['Any balance', 'Closes', 'Breaks', 'Indeterminate']);
  });

  function expectList(): TestRequest {
    return httpTesting.expectOne((request) => request.url === '/api/runs');
  }

  it('asks the server for the page, filter and sort in the address', async () => {
    await harness.navigateByUrl('/runs?state=submitted&page=2&sort=code&dir=asc');

    const params = expectList().request.params;
    expect(params.get('state')).toBe('submitted');
    expect(params.get('page')).toBe('2');
    expect(params.get('pageSize')).toBe('25');
    expect(params.get('sort')).toBe('code');
    expect(params.get('dir')).toBe('asc');
  });

  it('falls back to the newest runs first, all states, for a bare or garbled address', async () => {
    await harness.navigateByUrl('/runs?state=lost&page=-3&dir=sideways');

    const params = expectList().request.params;
    expect(params.has('state')).toBe(false);
    expect(params.get('page')).toBe('1');
    expect(params.get('sort')).toBe('updatedAt');
    expect(params.get('dir')).toBe('desc');
  });

  it('shows each run with its state as a word and its verdict as icon and word', async () => {
    await harness.navigateByUrl('/runs?page=2');
    expectList().flush(page);
    await harness.fixture.whenStable();

    const row = (harness.fixture.nativeElement as HTMLElement).querySelector('tr.mat-mdc-row');
    const cells = Array.from(row?.querySelectorAll('td') ?? []).map((cell) => cell.textContent?.trim());
    expect(cells.slice(0, 4)).toEqual(['R-0007', 'Argon, isothermal compression', 'isothermal', 'Submitted']);
    expect(row?.querySelector('qw-verdict-display')?.textContent).toContain('Breaks');
    expect(row?.querySelector('qw-verdict-display mat-icon')?.textContent?.trim()).toBe('cancel');
    expect((harness.fixture.nativeElement as HTMLElement).textContent).toContain('26 – 50 of 60');
  });

  it('moves to the next page through the address and loads it from the server', async () => {
    await harness.navigateByUrl('/runs?page=2');
    expectList().flush(page);
    await harness.fixture.whenStable();

    (harness.fixture.nativeElement as HTMLElement)
      .querySelector<HTMLButtonElement>('button.mat-mdc-paginator-navigation-next')
      ?.click();
    await harness.fixture.whenStable();

    expect(TestBed.inject(Router).url).toBe('/runs?page=3');
    expect(expectList().request.params.get('page')).toBe('3');
  });

  it("shows the server's detail when the list cannot be loaded", async () => {
    await harness.navigateByUrl('/runs');
    expectList().flush(
      { type: 'about:blank', title: 'Server error', status: 500, detail: 'The database did not answer. Try again shortly.' },
      { status: 500, statusText: 'Server Error' },
    );
    await harness.fixture.whenStable();

    expect((harness.fixture.nativeElement as HTMLElement).querySelector('[role="alert"]')?.textContent).toContain(
      'The database did not answer.',
    );
  });
});
