import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { Role } from '@contract';
import { routes } from '../../app.routes';
import { Auth } from '../../core/auth/auth';

// Every page shows a failed load the same way: the shared banner with the page's words for what failed (or the
// problem's title), the server's detail and its field messages, and no alert of the page's own beside it.
interface Case {
  page: string;
  role: Role;
  /** The load that fails. */
  request: string;
  /** The banner's title: the page's words, or the problem's own title where the page has none. */
  title: string;
}

const CASES: Case[] = [
  { page: '/home', role: 'technician', request: '/api/home', title: 'Your queues could not be loaded.' },
  { page: '/apparatus', role: 'quality', request: '/api/apparatus', title: 'The apparatus register could not be loaded.' },
  { page: '/apparatus/7', role: 'quality', request: '/api/apparatus/7/standardizations', title: 'The standardization of this apparatus could not be loaded.' },
  { page: '/gases', role: 'technician', request: '/api/gases', title: 'The gases could not be loaded.' },
  { page: '/instruments', role: 'quality', request: '/api/instruments', title: 'The instrument register could not be loaded.' },
  { page: '/instruments/9', role: 'quality', request: '/api/instruments/9', title: 'The instrument could not be loaded.' },
  { page: '/people', role: 'admin', request: '/api/people', title: 'Not found' },
  { page: '/projects', role: 'admin', request: '/api/projects', title: 'The projects could not be loaded.' },
  { page: '/runs/12', role: 'technician', request: '/api/runs/12', title: 'The run could not be loaded.' },
  { page: '/runs/12/edit', role: 'technician', request: '/api/runs/12', title: 'The run could not be loaded.' },
];

describe('a failed page load', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideRouter(routes, withComponentInputBinding()), provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => document.querySelector('.cdk-overlay-container')?.replaceChildren());

  it.each(CASES)('on $page is said by the shared banner: title, detail and field messages', async ({ page, role, request, title }) => {
    TestBed.inject(Auth).restore().subscribe();
    http.expectOne('/api/auth/me').flush({ person: { id: 5, email: `${role}@lab.test`, name: 'Lee Park', role } });
    const harness = await RouterTestingHarness.create();
    await harness.navigateByUrl(page);
    await harness.fixture.whenStable();
    const detail = `There is nothing at ${request} (spec).`;
    // The page's other loads (a form's lists) answer empty, until the one under test is asked and fails.
    let failed = 0;
    for (let round = 0; round < 5 && !failed; round++) {
      for (const req of http.match(() => true)) {
        if (req.request.method === 'GET' && req.request.url === request) {
          failed++;
          req.flush(
            { type: 'about:blank', title: 'Not found', status: 404, detail, errors: [{ field: 'id', message: 'no such record in the register' }] },
            { status: 404, statusText: 'Not Found' },
          );
        } else if (!req.cancelled) {
          req.flush({ items: [] });
        }
      }
      await harness.fixture.whenStable();
    }
    expect(failed).toBeGreaterThan(0);
    await harness.fixture.whenStable();
    const root = harness.fixture.nativeElement as HTMLElement;
    const banner = root.querySelector('qw-problem-banner [role="alert"]');
    expect(banner?.querySelector('.problem-title')?.textContent?.trim()).toBe(title);
    expect(banner?.querySelector('.problem-detail')?.textContent?.trim()).toBe(detail);
    expect(Array.from(banner?.querySelectorAll('.problem-fields li') ?? []).map((li) => li.textContent?.trim())).toEqual(['no such record in the register']);
    // No page-made error block beside the banner
    const alerts = Array.from(root.querySelectorAll('[role="alert"]'));
    expect(alerts.filter((a) => !a.closest('qw-problem-banner'))).toEqual([]);
    http.match(() => true);
  });
});
