import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { routes } from '../../app.routes';
import { Auth } from '../auth/auth';

describe('HeadingFocus in the shell', () => {
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
      .flush({ person: { id: 5, email: 'quality@lab.test', name: 'Ada Kim', role: 'quality' } });
    harness = await RouterTestingHarness.create();
    await harness.navigateByUrl('/home');
    httpTesting.expectOne('/api/home').flush({ role: 'quality', queues: [] });
    // The quality officer's home also lists apparatus whose standardization is due.
    httpTesting.expectOne('/api/apparatus-due').flush({ items: [] });
    await harness.fixture.whenStable();
  });

  afterEach(() => httpTesting.verify());

  it('leaves focus alone on the first page, then moves it to the new page heading', async () => {
    expect(document.activeElement?.tagName).not.toBe('H1');

    await harness.navigateByUrl('/instruments');
    httpTesting.expectOne('/api/instruments').flush({ items: [] });
    await harness.fixture.whenStable();

    expect(document.activeElement?.tagName).toBe('H1');
    expect(document.activeElement?.textContent?.trim()).toBe('Instruments');
  });

  it('keeps focus where it is when only the query changes', async () => {
    await harness.navigateByUrl('/instruments');
    httpTesting.expectOne('/api/instruments').flush({ items: [] });
    await harness.fixture.whenStable();
    const select = (harness.fixture.nativeElement as HTMLElement).querySelector<HTMLElement>('mat-select');
    select?.focus();

    await harness.navigateByUrl('/instruments?status=expired');
    await harness.fixture.whenStable();

    expect(document.activeElement).toBe(select);
  });
});
