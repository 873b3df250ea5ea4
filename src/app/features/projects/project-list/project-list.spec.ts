import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { routes } from '../../../app.routes';
import { Auth } from '../../../core/auth/auth';
import { Project } from '../projects.models';

const gasLab: Project = {
  id: 1,
  code: 'GX',
  name: 'Gas expansion, teaching lab 2',
  description: 'Piston-cell runs.',
  members: [
    { id: 1, name: 'Lee Park', role: 'technician' },
    { id: 3, name: 'Dana Ortiz', role: 'investigator' },
  ],
};

describe('Projects', () => {
  let httpTesting: HttpTestingController;
  let harness: RouterTestingHarness;

  beforeAll(() => import('./project-list'), 30_000);

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
    await harness.navigateByUrl('/projects');
    httpTesting.expectOne('/api/projects').flush({ items: [gasLab] });
    await harness.fixture.whenStable();
  });

  afterEach(() => {
    document.querySelector('.cdk-overlay-container')?.replaceChildren();
    httpTesting.verify();
  });

  function root(): HTMLElement {
    return harness.fixture.nativeElement as HTMLElement;
  }

  it('lists each project with its members and their roles', () => {
    const card = root().querySelector('li.project');
    expect(card?.querySelector('h2')?.textContent?.replace(/\s+/g, ' ').trim()).toBe('GXGas expansion, teaching lab 2');
    const members = Array.from(card?.querySelectorAll('ul li') ?? []).map((li) => li.textContent?.replace(/\s+/g, ' ').trim());
    expect(members).toEqual(['Lee Park · Technician', 'Dana Ortiz · Principal investigator']);
  });

  it('replaces the members with exactly the people ticked', async () => {
    Array.from(root().querySelectorAll<HTMLButtonElement>('button'))
      .find((b) => b.textContent?.includes('Edit members of GX'))
      ?.click();
    await harness.fixture.whenStable();
    httpTesting.expectOne('/api/people').flush({
      items: [
        { id: 3, email: 'pi@lab.test', name: 'Dana Ortiz', role: 'investigator', active: true, lockedUntil: null },
        { id: 1, email: 'tech@lab.test', name: 'Lee Park', role: 'technician', active: true, lockedUntil: null },
        { id: 2, email: 'asst@lab.test', name: 'Mo Chen', role: 'assistant', active: true, lockedUntil: null },
      ],
    });
    await harness.fixture.whenStable();

    const dialog = document.querySelector<HTMLElement>('qw-project-members');
    const option = (name: string) =>
      Array.from(dialog?.querySelectorAll<HTMLElement>('mat-list-option') ?? []).find((o) => o.textContent?.includes(name));
    expect(option('Lee Park')?.getAttribute('aria-selected')).toBe('true');
    expect(option('Mo Chen')?.getAttribute('aria-selected')).toBe('false');

    option('Mo Chen')?.click();
    option('Lee Park')?.click();
    await harness.fixture.whenStable();
    Array.from(dialog?.querySelectorAll<HTMLButtonElement>('button') ?? [])
      .find((b) => b.textContent?.includes('Save members'))
      ?.click();

    const put = httpTesting.expectOne('/api/projects/1/members');
    expect(put.request.method).toBe('PUT');
    expect(put.request.body).toEqual({ personIds: [2, 3] });
    put.flush({ id: 1, members: [2, 3] });
    // The dialog reports after its closing animation; then the page reloads the list.
    let reload = httpTesting.match('/api/projects');
    for (let tick = 0; tick < 100 && reload.length === 0; tick++) {
      await new Promise((resolve) => setTimeout(resolve, 10));
      reload = httpTesting.match('/api/projects');
    }
    expect(reload).toHaveLength(1);
    reload[0].flush({ items: [gasLab] });
  });
});
