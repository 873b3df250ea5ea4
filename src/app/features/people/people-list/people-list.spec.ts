import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { routes } from '../../../app.routes';
import { Auth } from '../../../core/auth/auth';
import { PersonRecord } from '../people.models';
import { Confirmation } from '../../../shared/confirmation/confirmation';

const inAnHour = new Date(Date.now() + 3_600_000).toISOString();
const anHourAgo = new Date(Date.now() - 3_600_000).toISOString();

const people: PersonRecord[] = [
  { id: 5, email: 'admin@lab.test', name: 'Ada Admin', role: 'admin', active: true, lockedUntil: null },
  { id: 1, email: 'tech@lab.test', name: 'Lee Park', role: 'technician', active: true, lockedUntil: inAnHour },
  { id: 2, email: 'asst@lab.test', name: 'Mo Chen', role: 'assistant', active: true, lockedUntil: anHourAgo },
  { id: 3, email: 'old@lab.test', name: 'Ola Berg', role: 'investigator', active: false, lockedUntil: null },
];

describe('PeopleList', () => {
  let httpTesting: HttpTestingController;
  let harness: RouterTestingHarness;

  beforeAll(() => import('./people-list'), 30_000);

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideRouter(routes), provideHttpClient(), provideHttpClientTesting()],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    TestBed.inject(Auth).restore().subscribe();
    httpTesting
      .expectOne('/api/auth/me')
      .flush({ person: { id: 5, email: 'admin@lab.test', name: 'Ada Admin', role: 'admin' } });
    harness = await RouterTestingHarness.create();
    await harness.navigateByUrl('/people');
    httpTesting.expectOne('/api/people').flush({ items: people });
    await harness.fixture.whenStable();
  });

  afterEach(() => httpTesting.verify());

  function root(): HTMLElement {
    return harness.fixture.nativeElement as HTMLElement;
  }

  function rowOf(name: string): HTMLElement {
    const row = Array.from(root().querySelectorAll<HTMLElement>('tr.mat-mdc-row')).find((r) =>
      r.textContent?.includes(name),
    );
    if (!row) throw new Error(`No row for ${name}`);
    return row;
  }

  function unlockButtons(): string[] {
    return Array.from(root().querySelectorAll('button[aria-label^="Unlock "]')).map(
      (b) => b.getAttribute('aria-label') ?? '',
    );
  }

  it('offers Unlock only for an account whose lock has not run out', () => {
    expect(unlockButtons()).toEqual(['Unlock Lee Park']);
    expect(rowOf('Lee Park').textContent).toContain('Locked until');
    expect(rowOf('Mo Chen').textContent).toContain('Open');
    expect(rowOf('Ola Berg').textContent).toContain('Deactivated');
  });

  it('unlocks with { unlock: true } and shows the list again as the server has it', async () => {
    rowOf('Lee Park').querySelector<HTMLButtonElement>('button[aria-label="Unlock Lee Park"]')?.click();

    const patch = httpTesting.expectOne('/api/people/1');
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toEqual({ unlock: true });
    patch.flush({ ...people[1], lockedUntil: null });
    await harness.fixture.whenStable();
    httpTesting
      .expectOne('/api/people')
      .flush({ items: people.map((p) => (p.id === 1 ? { ...p, lockedUntil: null } : p)) });
    await harness.fixture.whenStable();

    expect(unlockButtons()).toEqual([]);
    expect(rowOf('Lee Park').textContent).toContain('Open');
  });

  it('changes a role through the menu and confirms it visibly', async () => {
    const shown = jest.spyOn(TestBed.inject(Confirmation), 'show');
    rowOf('Mo Chen').querySelector<HTMLButtonElement>('button[aria-label="Change Mo Chen"]')?.click();
    await harness.fixture.whenStable();
    const item = (text: string) =>
      Array.from(document.querySelectorAll<HTMLButtonElement>('[mat-menu-item], .mat-mdc-menu-item')).find((b) => b.textContent?.includes(text));
    item('Change role')?.click();
    await harness.fixture.whenStable();
    item('Technician')?.click();
    const patch = httpTesting.expectOne('/api/people/2');
    expect(patch.request.body).toEqual({ role: 'technician' });
    patch.flush({ ...people[2], role: 'technician' });
    await harness.fixture.whenStable();
    httpTesting.expectOne('/api/people').flush({ items: people });
    expect(shown).toHaveBeenCalledWith('Mo Chen is now Technician.');
  });

  it("shows the server's refusal when a change is not allowed", async () => {
    rowOf('Lee Park').querySelector<HTMLButtonElement>('button[aria-label="Unlock Lee Park"]')?.click();
    httpTesting.expectOne('/api/people/1').flush(
      { type: 'about:blank', title: 'Not found', status: 404, detail: 'There is no person with id 1.' },
      { status: 404, statusText: 'Not Found' },
    );
    await harness.fixture.whenStable();

    expect(root().querySelector('[role="alert"]')?.textContent).toContain('There is no person with id 1.');
    const banner = root().querySelector('qw-problem-banner [role="alert"]');
    expect(banner?.querySelector('.problem-title')?.textContent?.trim()).toBe('Not found');
    expect(banner?.querySelector('.problem-detail')?.textContent?.trim()).toBe('There is no person with id 1.');
  });

  describe('adding a person', () => {
    async function openForm(): Promise<HTMLElement> {
      Array.from(root().querySelectorAll<HTMLButtonElement>('button'))
        .find((b) => b.textContent?.includes('Add person'))
        ?.click();
      await harness.fixture.whenStable();
      const dialog = document.querySelector<HTMLElement>('qw-person-form');
      if (!dialog) throw new Error('The add-person dialog did not open');
      return dialog;
    }

    function type(dialog: HTMLElement, label: string, value: string): void {
      const input = Array.from(dialog.querySelectorAll('mat-form-field'))
        .find((f) => f.querySelector('mat-label')?.textContent?.trim() === label)
        ?.querySelector('input') as HTMLInputElement;
      input.value = value;
      input.dispatchEvent(new Event('input'));
      input.dispatchEvent(new Event('blur'));
    }

    afterEach(() => document.querySelector('.cdk-overlay-container')?.replaceChildren());

    it('shows the password rule before anything is typed, and refuses a short password', async () => {
      const dialog = await openForm();
      expect(dialog.querySelector('.password-hint')?.textContent?.trim()).toBe(
        'At least 12 characters; a short sentence works well.',
      );

      type(dialog, 'Full name', 'Noor Haddad');
      type(dialog, 'Email', 'noor@lab.test');
      type(dialog, 'First password', 'short-pass');
      dialog.querySelector<HTMLFormElement>('form')?.dispatchEvent(new Event('submit'));
      await harness.fixture.whenStable();

      expect(dialog.textContent).toContain('The password needs at least 12 characters.');
      httpTesting.expectNone((request) => request.method === 'POST');
    });

    it('posts the new person and names a taken address (409) beside the email field', async () => {
      const dialog = await openForm();
      type(dialog, 'Full name', 'Noor Haddad');
      type(dialog, 'Email', 'noor@lab.test');
      type(dialog, 'First password', 'a long enough password');
      dialog.querySelector<HTMLFormElement>('form')?.dispatchEvent(new Event('submit'));

      const post = httpTesting.expectOne((request) => request.method === 'POST' && request.url === '/api/people');
      expect(post.request.body).toEqual({
        name: 'Noor Haddad',
        email: 'noor@lab.test',
        role: 'technician',
        password: 'a long enough password',
      });
      post.flush(
        { type: 'about:blank', title: 'Conflict', status: 409, detail: 'noor@lab.test already has an account.' },
        { status: 409, statusText: 'Conflict' },
      );
      await harness.fixture.whenStable();

      expect(dialog.querySelector('[role="alert"]')?.textContent).toContain('noor@lab.test already has an account.');
      expect(dialog.textContent).toContain('This address already has an account.');
    });
  });
});
