import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatSelectionListHarness } from '@angular/material/list/testing';

import { PersonRecord } from '../../people/people.models';
import { Project } from '../projects.models';
import { ProjectMembers } from './project-members';

describe('ProjectMembers', () => {
  let fixture: ComponentFixture<ProjectMembers>;
  let loader: HarnessLoader;
  let httpTesting: HttpTestingController;
  let close: jest.Mock;

  const project: Project = {
    id: 3, code: 'GX', name: 'Gas expansion', description: '',
    members: [{ id: 12, name: 'Lena Okonkwo', role: 'technician' }],
  };
  const person = (id: number, name: string, role: PersonRecord['role'], active = true): PersonRecord =>
    ({ id, email: `p${id}@harrowgate-thermo.test`, name, role, active, lockedUntil: null });
  const lab = [person(12, 'Lena Okonkwo', 'technician'), person(15, 'Mateo Brandt', 'assistant'), person(9, 'Ingrid Halvorsen', 'investigator')];

  async function open(): Promise<void> {
    close = jest.fn();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MAT_DIALOG_DATA, useValue: project },
        { provide: MatDialogRef, useValue: { close } },
      ],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ProjectMembers);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  afterEach(() => httpTesting.verify());

  const text = () => (fixture.nativeElement as HTMLElement).textContent?.replace(/\s+/g, ' ') ?? '';
  const alert = () => (fixture.nativeElement as HTMLElement).querySelector('[role="alert"]')?.textContent ?? '';
  const saveButton = () => loader.getHarness(MatButtonHarness.with({ text: /Save members|Saving/ }));

  async function loaded(): Promise<MatSelectionListHarness> {
    httpTesting.expectOne('/api/people').flush({ items: lab });
    await fixture.whenStable();
    return loader.getHarness(MatSelectionListHarness);
  }

  it('ticks the present members, counts the choice and saves the ids in order, closing with the stored members', async () => {
    await open();
    const list = await loaded();
    const ticked = await list.getItems({ selected: true });
    expect(await Promise.all(ticked.map((item) => item.getTitle()))).toEqual(['Lena Okonkwo']);
    expect(text()).toContain('1 chosen');

    await list.selectItems({ title: 'Mateo Brandt' }, { title: 'Ingrid Halvorsen' });
    expect(text()).toContain('3 chosen');
    await (await saveButton()).click();

    const request = httpTesting.expectOne('/api/projects/3/members');
    expect(request.request.method).toBe('PUT');
    expect(request.request.body).toEqual({ personIds: [9, 12, 15] });
    expect(await (await saveButton()).isDisabled()).toBe(true); // one request at a time
    request.flush({ id: 3, members: [9, 12, 15] });
    expect(close).toHaveBeenCalledWith([9, 12, 15]);
  });

  it("shows a refusal with the server's messages and stays open for another try", async () => {
    await open();
    const list = await loaded();
    await list.deselectItems({ title: 'Lena Okonkwo' });
    await (await saveButton()).click();
    httpTesting.expectOne('/api/projects/3/members').flush(
      { title: 'Bad Request', status: 400, detail: 'The member list has problems.', errors: [{ field: 'personIds.0', message: 'Person 99 does not exist.' }] },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    expect(alert()).toContain('The member list has problems.');
    expect(alert()).toContain('Person 99 does not exist.');
    expect(close).not.toHaveBeenCalled();

    await list.selectItems({ title: 'Mateo Brandt' });
    await (await saveButton()).click();
    httpTesting.expectOne('/api/projects/3/members').flush({ id: 3, members: [15] });
    expect(close).toHaveBeenCalledWith([15]);
  });

  it('says why the lab could not be read and offers no save', async () => {
    await open();
    httpTesting.expectOne('/api/people').flush({ title: 'Forbidden', status: 403, detail: 'Only administrators list people.' }, { status: 403, statusText: 'Forbidden' });
    await fixture.whenStable();
    expect(alert()).toContain('Only administrators list people.');
    expect(await (await saveButton()).isDisabled()).toBe(true);
  });
});
