import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { routes } from '../../app.routes';
import { Auth } from '../auth/auth';
import { ROLES, Role } from '../auth/auth.models';
import { navigationFor } from './navigation';

const EXPECTED: Record<Role, string[]> = {
  technician: ['Home', 'Runs', 'New run', 'Import', 'Instruments', 'Apparatus', 'Gases'],
  assistant: ['Home', 'Runs', 'New run', 'Import', 'Instruments', 'Apparatus', 'Gases'],
  investigator: ['Home', 'Runs', 'New run', 'Import', 'Instruments', 'Apparatus', 'Gases', 'Audit trail'],
  quality: ['Home', 'Runs', 'Instruments', 'Apparatus', 'Gases', 'Audit trail'],
  admin: ['Home', 'Instruments', 'Apparatus', 'Gases', 'People', 'Projects'],
};

describe('navigationFor', () => {
  it.each(ROLES)('gives %s its own entries', (role) => {
    expect(navigationFor(role).map((entry) => entry.label)).toEqual(EXPECTED[role]);
  });

  it('gives nobody any entries when signed out', () => {
    expect(navigationFor(null)).toEqual([]);
  });

  it('points every entry at a route that exists in app.routes.ts', () => {
    const shellChildren = routes.find((route) => route.path === '')?.children ?? [];
    const paths = shellChildren.map((route) => `/${route.path}`);
    for (const role of ROLES) {
      for (const entry of navigationFor(role)) {
        // A page inside a feature (/runs/new) lives under its feature's route.
        expect(paths).toContain(`/${entry.path.split('/')[1]}`);
      }
    }
  });
});

describe('Shell navigation', () => {
  let httpTesting: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideRouter(routes), provideHttpClient(), provideHttpClientTesting()],
    });
    httpTesting = TestBed.inject(HttpTestingController);
  });

  afterEach(() => httpTesting.verify());

  it.each(ROLES)('shows %s its links, its name and role, and marks the current page', async (role) => {
    TestBed.inject(Auth).restore().subscribe();
    httpTesting
      .expectOne('/api/auth/me')
      .flush({ person: { id: 9, email: `${role}@lab.test`, name: 'Robin Vale', role } });
    const harness = await RouterTestingHarness.create();

    await harness.navigateByUrl('/instruments');
    httpTesting.expectOne('/api/instruments').flush({ items: [] });

    const root = harness.fixture.nativeElement as HTMLElement;
    const links = Array.from(root.querySelectorAll<HTMLAnchorElement>('nav[aria-label="Main"] a'));
    expect(links.map((link) => link.textContent?.trim())).toEqual(
      EXPECTED[role].map((label) => expect.stringContaining(label)),
    );
    const current = links.filter((link) => link.getAttribute('aria-current') === 'page');
    expect(current.map((link) => link.getAttribute('href'))).toEqual(['/instruments']);
    expect(root.querySelector('header')?.textContent).toContain('Robin Vale');
    expect(root.querySelector('a.skip-link')?.textContent?.trim()).toBe('Skip to main content');
  });
});
