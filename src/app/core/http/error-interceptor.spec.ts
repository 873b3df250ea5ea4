import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { routes } from '../../app.routes';
import { Auth } from '../auth/auth';
import { errorInterceptor } from './error-interceptor';

describe('errorInterceptor', () => {
  let httpTesting: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideRouter(routes),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    TestBed.inject(Auth).restore().subscribe();
    httpTesting
      .expectOne('/api/auth/me')
      .flush({ person: { id: 4, email: 'quality@lab.test', name: 'Ada Kim', role: 'quality' } });
  });

  afterEach(() => {
    // The sign-in page asks whether the demo lab is loaded; these specs are about where it is reached.
    httpTesting.match('/api/health');
    httpTesting.verify();
  });

  it('sends the person back to sign-in when the session ends mid-work, and drops them', async () => {
    const harness = await RouterTestingHarness.create();
    await harness.navigateByUrl('/instruments?status=expired');

    httpTesting
      .expectOne('/api/instruments')
      .flush({ status: 401, title: 'Unauthorized', detail: 'Your session has ended.' }, { status: 401, statusText: 'Unauthorized' });
    await harness.fixture.whenStable();

    expect(TestBed.inject(Auth).person()).toBeNull();
    expect(TestBed.inject(Router).url).toBe('/sign-in?returnUrl=%2Finstruments%3Fstatus%3Dexpired');
  });

  it('leaves a 403 to the page, which shows the detail', async () => {
    const harness = await RouterTestingHarness.create();
    await harness.navigateByUrl('/instruments');

    httpTesting
      .expectOne('/api/instruments')
      .flush({ status: 403, title: 'Forbidden', detail: 'Only quality officers may see this.' }, { status: 403, statusText: 'Forbidden' });
    await harness.fixture.whenStable();

    expect(TestBed.inject(Router).url).toBe('/instruments');
    expect(TestBed.inject(Auth).person()).not.toBeNull();
    expect((harness.fixture.nativeElement as HTMLElement).querySelector('[role="alert"]')?.textContent).toContain(
      'Only quality officers may see this.',
    );
  });
});
