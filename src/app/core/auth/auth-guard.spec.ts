import { Location } from '@angular/common';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { routes } from '../../app.routes';
import { Auth } from './auth';
import { Role } from './auth.models';

describe('authGuard and roleGuard on the app routes', () => {
  let httpTesting: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideRouter(routes), provideHttpClient(), provideHttpClientTesting()],
    });
    httpTesting = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    // The sign-in page asks whether the demo lab is loaded; these specs are about where it is reached.
    httpTesting.match('/api/health');
    httpTesting.verify();
  });

  function answerMe(role: Role | null): void {
    TestBed.inject(Auth).restore().subscribe();
    const me = httpTesting.expectOne('/api/auth/me');
    if (role) {
      me.flush({ person: { id: 1, email: `${role}@lab.test`, name: 'Sam Reyes', role } });
    } else {
      me.flush({ status: 401, title: 'Unauthorized', detail: 'Sign in first.' }, { status: 401, statusText: 'Unauthorized' });
    }
  }

  function heading(harness: RouterTestingHarness): string | undefined {
    return (harness.fixture.nativeElement as HTMLElement).querySelector('h1')?.textContent?.trim();
  }

  it('sends a signed-out person to sign-in, keeping where they were heading in returnUrl', async () => {
    answerMe(null);
    const harness = await RouterTestingHarness.create();

    await harness.navigateByUrl('/runs?state=draft');

    const router = TestBed.inject(Router);
    expect(router.url).toBe('/sign-in?returnUrl=%2Fruns%3Fstate%3Ddraft');
    expect(heading(harness)).toBe('Sign in');
  });

  it('asks the server who is signed in before deciding', async () => {
    const harness = await RouterTestingHarness.create();
    const navigation = harness.navigateByUrl('/instruments');

    await new Promise((resolve) => setTimeout(resolve));
    httpTesting.expectOne('/api/auth/me').flush({ person: { id: 2, email: 'q@lab.test', name: 'Ada Kim', role: 'quality' } });
    await navigation;

    expect(TestBed.inject(Router).url).toBe('/instruments');
    httpTesting.expectOne('/api/instruments').flush({ items: [] });
  });

  it('shows the "not for your role" page in place of a page the role may not open', async () => {
    answerMe('technician');
    const harness = await RouterTestingHarness.create();

    await harness.navigateByUrl('/people');

    expect(heading(harness)).toBe('Not for your role');
    expect(harness.fixture.nativeElement.textContent).toContain('Technician');
    // The address bar is not rewritten to /forbidden.
    expect(TestBed.inject(Location).path()).not.toBe('/forbidden');
    httpTesting.expectNone('/api/people');
  });

  it('lets the role named in the route data through', async () => {
    answerMe('admin');
    const harness = await RouterTestingHarness.create();

    await harness.navigateByUrl('/people');

    expect(heading(harness)).toBe('People');
    httpTesting.expectOne('/api/people').flush({ items: [] });
  });

  it('keeps a signed-in person away from the sign-in page', async () => {
    answerMe('assistant');
    const harness = await RouterTestingHarness.create();

    await harness.navigateByUrl('/sign-in');

    expect(TestBed.inject(Router).url).toBe('/home');
    httpTesting.expectOne('/api/home').flush({ role: 'assistant', queues: [] });
  });
});
