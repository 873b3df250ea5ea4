import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { routes } from '../../app.routes';
import { Auth } from '../../core/auth/auth';
import { SignIn, safeReturnUrl } from './sign-in';

describe('SignIn', () => {
  let httpTesting: HttpTestingController;
  let harness: RouterTestingHarness;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        provideRouter(routes, withComponentInputBinding()),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    TestBed.inject(Auth).restore().subscribe();
    httpTesting.expectOne('/api/auth/me').flush({ status: 401 }, { status: 401, statusText: 'Unauthorized' });
    harness = await RouterTestingHarness.create();
    await harness.navigateByUrl('/sign-in?returnUrl=%2Fruns%3Fstate%3Dsubmitted');
    httpTesting.expectOne('/api/health').flush({ status: 'ok', db: 'ok', demoLab: true });
    await harness.fixture.whenStable();
  });

  afterEach(() => httpTesting.verify());

  function page(): HTMLElement {
    return harness.fixture.nativeElement as HTMLElement;
  }

  function type(label: string, value: string): void {
    const field = Array.from(page().querySelectorAll('mat-form-field')).find((f) =>
      f.querySelector('mat-label')?.textContent?.includes(label),
    );
    const input = field?.querySelector('input');
    if (!input) throw new Error(`No field labelled ${label}`);
    input.value = value;
    input.dispatchEvent(new Event('input'));
  }

  async function submit(email: string, password: string): Promise<void> {
    type('Email', email);
    type('Password', password);
    page().querySelector<HTMLButtonElement>('button[type="submit"]')?.click();
    await harness.fixture.whenStable();
  }

  async function refuse(status: number, detail: string): Promise<void> {
    httpTesting
      .expectOne('/api/auth/sign-in')
      .flush({ type: 'about:blank', title: 'Refused', status, detail }, { status, statusText: 'Refused' });
    await harness.fixture.whenStable();
  }

  it('labels both fields and says where to find the demo sign-ins', () => {
    const labels = Array.from(page().querySelectorAll('mat-label')).map((l) => l.textContent?.trim());
    expect(labels).toEqual(['Email', 'Password']);
    expect(page().querySelector('input[type="email"]')?.getAttribute('autocomplete')).toBe('username');
    expect(page().textContent).toContain('Demo lab: see the README for demo sign-ins.');
  });

  it('says nothing of a demo lab when the server has none loaded', async () => {
    // A second sign-in page beside the routed one asks again, and hears no.
    const other = TestBed.createComponent(SignIn);
    other.detectChanges();
    httpTesting.expectOne('/api/health').flush({ status: 'ok', db: 'ok', demoLab: false });
    await other.whenStable();
    const text = (other.nativeElement as HTMLElement).textContent ?? '';
    expect(text).toContain('Sign in');
    expect(text).not.toContain('Demo lab');
  });

  it('sends the email trimmed and the password as typed', async () => {
    // The browser strips ASCII spaces from type=email itself; a no-break space pasted from a
    // web page survives that and is the case the page's own trim() is for.
    await submit('\u00a0technician@lab.test\u00a0 ', ' pass word ');

    const request = httpTesting.expectOne({ method: 'POST', url: '/api/auth/sign-in' });
    expect(request.request.body).toEqual({ email: 'technician@lab.test', password: ' pass word ' });
    request.flush({ person: { id: 1, email: 'technician@lab.test', name: 'Lee Park', role: 'technician' } });
    await harness.fixture.whenStable();
    httpTesting.expectOne((r) => r.url === '/api/runs').flush({ items: [], total: 0, page: 1, pageSize: 25 });
    // The runs page's project and author filters.
    httpTesting.expectOne('/api/projects').flush({ items: [] });
    await harness.fixture.whenStable();

    // Back to the page the guard interrupted.
    expect(TestBed.inject(Router).url).toBe('/runs?state=submitted');
  });

  it("shows the server's detail when the password is wrong", async () => {
    const detail = 'The email or password is not right. 3 attempts left before the account locks for 15 minutes.';
    await submit('technician@lab.test', 'wrong');
    await refuse(401, detail);

    expect(page().querySelector('[role="alert"]')?.textContent?.trim()).toContain(detail);
    const banner = page().querySelector('qw-problem-banner [role="alert"]');
    expect(banner?.querySelector('.problem-title')?.textContent?.trim()).toBe('Not signed in.');
    expect(banner?.querySelector('.problem-detail')?.textContent?.trim()).toBe(detail);
    expect(banner?.querySelector('mat-icon')?.textContent?.trim()).toBe('error');
    expect(TestBed.inject(Router).url).toContain('/sign-in');
  });

  it("shows the locked account's detail with a lock icon", async () => {
    const detail = 'This account is locked until 14:32 after 5 failed sign-ins.';
    await submit('technician@lab.test', 'wrong');
    await refuse(423, detail);

    const alert = page().querySelector('qw-problem-banner [role="alert"]');
    expect(alert?.querySelector('.problem-detail')?.textContent?.trim()).toBe(detail);
    expect(alert?.querySelector('mat-icon')?.textContent?.trim()).toBe('lock');
  });

  it('says so when too many attempts came from this address', async () => {
    await submit('technician@lab.test', 'wrong');
    httpTesting.expectOne('/api/auth/sign-in').flush(null, { status: 429, statusText: 'Too Many Requests' });
    await harness.fixture.whenStable();

    expect(page().querySelector('[role="alert"]')?.textContent).toMatch(/Too many attempts/);
  });

  it('does not call the server while a field is empty or the address is malformed', async () => {
    await submit('not-an-address', '');

    httpTesting.expectNone('/api/auth/sign-in');
    const errors = Array.from(page().querySelectorAll('mat-error')).map((e) => e.textContent?.trim());
    expect(errors).toEqual(['Enter an address like name@lab.example.', 'Enter your password.']);
  });
});

describe('safeReturnUrl', () => {
  it('only returns to paths inside Qwell', () => {
    expect(safeReturnUrl('/runs?state=draft')).toBe('/runs?state=draft');
    expect(safeReturnUrl('//elsewhere.example/x')).toBe('/home');
    expect(safeReturnUrl('https://elsewhere.example')).toBe('/home');
    expect(safeReturnUrl('/sign-in')).toBe('/home');
    expect(safeReturnUrl(undefined)).toBe('/home');
  });
});
