import { LiveAnnouncer } from '@angular/cdk/a11y';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { routes } from '../../../app.routes';
import { Auth } from '../../../core/auth/auth';
import { AuditPage } from '../audit.models';

const page: AuditPage = {
  items: [
    {
      id: 31,
      occurredAt: '2026-11-30T09:15:00Z',
      actorId: 4,
      actorEmail: 'quality@lab.test',
      action: 'calibration.create',
      entityType: 'instrument',
      entityId: '3',
      before: null,
      after: { certificate: 'HIAT-CAL-2402', dueOn: '2027-11-20' },
      reason: null,
      ip: '127.0.0.1',
      prevHash: 'a'.repeat(64),
      hash: 'b'.repeat(64),
      actorName: 'Sam Reyes',
      actionLabel: 'Added a calibration',
      recordType: 'Instrument',
      record: 'PG-2',
      changes: [
        { field: 'certificate', before: null, after: 'HIAT-CAL-2402' },
        { field: 'due on', before: null, after: '2027-11-20' },
      ],
    },
  ],
  total: 120,
  page: 2,
  pageSize: 50,
};

describe('AuditTrail', () => {
  let httpTesting: HttpTestingController;
  let harness: RouterTestingHarness;
  let announce: jest.SpyInstance;

  // The page is a lazy route; loading (and transforming) it once up front keeps each test's own time small.
  beforeAll(() => import('./audit-trail'), 30_000);

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideRouter(routes), provideHttpClient(), provideHttpClientTesting()],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    announce = jest.spyOn(TestBed.inject(LiveAnnouncer), 'announce').mockResolvedValue();
    TestBed.inject(Auth).restore().subscribe();
    httpTesting
      .expectOne('/api/auth/me')
      .flush({ person: { id: 4, email: 'quality@lab.test', name: 'Sam Reyes', role: 'quality' } });
    harness = await RouterTestingHarness.create();
  });

  afterEach(() => {
    // The person filter's list of people in the trail.
    httpTesting.match('/api/audit/actors').forEach((request) => request.flush({ items: [] }));
    httpTesting.verify();
  });

  it('offers the people who appear in the trail as the person filter', async () => {
    await harness.navigateByUrl('/audit');
    httpTesting.expectOne('/api/audit/actors').flush({ items: [{ id: 4, name: 'Sam Reyes', email: 'quality@lab.test' }] });
    expectList().flush({ items: [], total: 0, page: 1, pageSize: 50 });
    harness.fixture.detectChanges();
    const trigger = root().querySelector<HTMLElement>('mat-select[formcontrolname="person"] .mat-mdc-select-trigger')!;
    trigger.click();
    harness.fixture.detectChanges();
    await harness.fixture.whenStable();
    const options = Array.from(document.querySelectorAll('mat-option')).map((o) => o.textContent?.trim());
    expect(options).toEqual(['Anyone', 'Sam Reyes (quality@lab.test)']);
  });

  function root(): HTMLElement {
    return harness.fixture.nativeElement as HTMLElement;
  }

  function expectList(): TestRequest {
    return httpTesting.expectOne((request) => request.url === '/api/audit');
  }

  function button(text: string): HTMLButtonElement {
    const found = Array.from(root().querySelectorAll<HTMLButtonElement>('button')).find((b) =>
      b.textContent?.includes(text),
    );
    if (!found) throw new Error(`No button ${text}`);
    return found;
  }

  it('asks the server for the filters and page in the address, and exports with the same filters', async () => {
    await harness.navigateByUrl(
      '/audit?run=12&person=4&action=run.submit&entityType=run&from=2026-11-01&to=2026-11-30&page=2',
    );

    const request = expectList();
    const params = request.request.params;
    expect(params.get('run')).toBe('12');
    expect(params.get('person')).toBe('4');
    expect(params.get('action')).toBe('run.submit');
    expect(params.get('entityType')).toBe('run');
    expect(params.get('from')).toBe('2026-11-01');
    expect(params.get('to')).toBe('2026-11-30');
    expect(params.get('page')).toBe('2');
    expect(params.get('pageSize')).toBe('50');
    request.flush(page);
    await harness.fixture.whenStable();

    const links = Array.from(root().querySelectorAll<HTMLAnchorElement>('a[download]')).map((a) =>
      a.getAttribute('href'),
    );
    expect(links).toEqual([
      '/api/audit/export?format=xlsx&run=12&person=4&action=run.submit&entityType=run&from=2026-11-01&to=2026-11-30',
      '/api/audit/export?format=csv&run=12&person=4&action=run.submit&entityType=run&from=2026-11-01&to=2026-11-30',
      '/api/audit/export?format=pdf&run=12&person=4&action=run.submit&entityType=run&from=2026-11-01&to=2026-11-30',
    ]);
  });

  it('leaves garbled filters out instead of sending them', async () => {
    await harness.navigateByUrl('/audit?run=abc&from=30/11/2026&action=DROP%20TABLE');

    const params = expectList().request.params;
    expect(params.has('run')).toBe(false);
    expect(params.has('from')).toBe(false);
    expect(params.has('action')).toBe(false);
    expect(params.get('page')).toBe('1');
  });

  it('puts the filters typed in the form into the address and the query, back on page 1', async () => {
    await harness.navigateByUrl('/audit?page=3');
    expectList().flush({ ...page, page: 3 });
    await harness.fixture.whenStable();

    const form = root().querySelector<HTMLFormElement>('form.filters');
    const input = (label: string) =>
      Array.from(form?.querySelectorAll('mat-form-field') ?? [])
        .find((f) => f.querySelector('mat-label')?.textContent?.trim() === label)
        ?.querySelector('input') as HTMLInputElement;
    input('Run code').value = ' r-2026-0007 ';
    input('Run code').dispatchEvent(new Event('input'));
    input('From').value = '2026-11-01';
    input('From').dispatchEvent(new Event('input'));
    form?.dispatchEvent(new Event('submit'));
    await harness.fixture.whenStable();

    expect(TestBed.inject(Router).url).toBe('/audit?run=R-2026-0007&from=2026-11-01');
    const params = expectList().request.params;
    expect(params.get('run')).toBe('R-2026-0007');
    expect(params.get('from')).toBe('2026-11-01');
    expect(params.get('page')).toBe('1');
  });

  it('shows each event and its before and after on demand', async () => {
    await harness.navigateByUrl('/audit');
    expectList().flush(page);
    await harness.fixture.whenStable();

    const row = root().querySelector('tr.mat-mdc-row');
    // People by name, actions in words, records by their codes.
    expect(row?.textContent).toContain('Sam Reyes');
    expect(row?.textContent).toContain('Added a calibration');
    expect(row?.textContent).toContain('Instrument PG-2');
    expect(row?.textContent).not.toContain('calibration.create');
    expect(root().querySelector('.detail')).toBeNull();

    const toggle = row?.querySelector<HTMLButtonElement>('button[aria-expanded]');
    toggle?.click();
    await harness.fixture.whenStable();

    expect(toggle?.getAttribute('aria-expanded')).toBe('true');
    const detail = root().querySelector('.detail');
    const rows = Array.from(detail?.querySelectorAll('table.changes tbody tr') ?? []).map((tr) =>
      Array.from(tr.children).map((cell) => cell.textContent?.trim()),
    );
    expect(rows).toEqual([
      ['certificate', '—', 'HIAT-CAL-2402'],
      ['due on', '—', '2027-11-20'],
    ]);
    // The stored JSON stays one click away.
    expect(detail?.querySelector('details.raw')?.textContent).toContain('"certificate": "HIAT-CAL-2402"');
  });

  it('leaves sign-ins out when asked, in the address and the request', async () => {
    await harness.navigateByUrl('/audit');
    expectList().flush(page);
    await harness.fixture.whenStable();
    const box = root().querySelector<HTMLInputElement>('form.filters mat-checkbox input')!;
    box.click();
    root().querySelector<HTMLFormElement>('form.filters')?.dispatchEvent(new Event('submit'));
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/audit?hideSignIns=true');
    expect(expectList().request.params.get('signIns')).toBe('hide');
  });

  it('shows and announces an intact chain with the number of events checked', async () => {
    await harness.navigateByUrl('/audit');
    expectList().flush(page);
    await harness.fixture.whenStable();

    button('Verify the chain').click();
    httpTesting.expectOne('/api/audit/verify').flush({ valid: true, checked: 120 });
    await harness.fixture.whenStable();

    const result = root().querySelector('[data-testid="chain-result"]');
    expect(result?.querySelector('mat-icon')?.textContent?.trim()).toBe('verified');
    expect(result?.textContent).toContain('Chain intact');
    expect(result?.textContent).toContain('all 120 events checked');
    expect(result?.classList.contains('broken')).toBe(false);
    expect(announce).toHaveBeenCalledWith(
      'The audit chain is intact: all 120 events checked, none altered.',
      'assertive',
    );
  });

  it('shows and announces the first broken event and why', async () => {
    await harness.navigateByUrl('/audit');
    expectList().flush(page);
    await harness.fixture.whenStable();

    button('Verify the chain').click();
    httpTesting
      .expectOne('/api/audit/verify')
      .flush({ valid: false, checked: 57, firstBroken: { id: 57, reason: 'hash does not match its content' } });
    await harness.fixture.whenStable();

    const result = root().querySelector('[data-testid="chain-result"]');
    expect(result?.querySelector('mat-icon')?.textContent?.trim()).toBe('gpp_bad');
    expect(result?.textContent).toContain('Chain broken');
    expect(result?.textContent).toContain('broken at event 57: hash does not match its content');
    expect(result?.classList.contains('broken')).toBe(true);
    expect(announce).toHaveBeenCalledWith(
      'The audit chain is broken at event 57: hash does not match its content. 57 events checked.',
      'assertive',
    );
  });

  it('shows a chain check that could not run in the shared problem banner, and announces it', async () => {
    await harness.navigateByUrl('/audit');
    expectList().flush(page);
    await harness.fixture.whenStable();

    button('Verify the chain').click();
    const detail = 'Something went wrong on the server. Try again; if it keeps happening, tell your administrator.';
    httpTesting.expectOne('/api/audit/verify').flush({ type: 'about:blank', title: 'Server error', status: 500, detail }, { status: 500, statusText: 'Internal Server Error' });
    await harness.fixture.whenStable();

    const banner = root().querySelector('qw-problem-banner [role="alert"]');
    expect(banner?.querySelector('.problem-title')?.textContent?.trim()).toBe('The chain could not be checked.');
    expect(banner?.querySelector('.problem-detail')?.textContent?.trim()).toBe(detail);
    expect(Array.from(root().querySelectorAll('[role="alert"]')).filter((a) => !a.closest('qw-problem-banner'))).toEqual([]);
    expect(announce).toHaveBeenCalledWith(`The chain could not be checked. ${detail}`, 'assertive');
  });
});
