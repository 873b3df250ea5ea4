import { LiveAnnouncer } from '@angular/cdk/a11y';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatRadioGroupHarness } from '@angular/material/radio/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { Router, provideRouter } from '@angular/router';

import { SAMPLE_PREVIEW as PREVIEW } from '../import-preview-sample';
import { ImportPreview } from '../imports.models';
import { ImportPage } from './import-page';

describe('ImportPage', () => {
  // The preview, mapping and target steps are driven through harnesses; on a busy machine that can pass 5 s.
  jest.setTimeout(20_000);
  let httpTesting: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()] });
    httpTesting = TestBed.inject(HttpTestingController);
  });

  afterEach(() => httpTesting.verify());

  async function withPreview() {
    const fixture = TestBed.createComponent(ImportPage);
    await fixture.whenStable();
    httpTesting.expectOne('/api/projects').flush({ items: [{ id: 3, code: 'GX', name: 'Gas expansion, teaching lab 2' }] });
    httpTesting.match((r) => r.url === '/api/runs').forEach((r) => r.flush({ items: [] }));
    httpTesting.expectOne('/api/gases').flush({ items: [{ id: 4, code: 'N2', name: 'Nitrogen', molarMass: 0.028, model: 'shomate' }] });
    httpTesting.expectOne('/api/apparatus').flush({ items: [{ id: 2, tag: 'PC-3', name: 'Piston cell PC-3', kind: 'piston-cell' }] });
    const preview: ImportPreview = { ...PREVIEW, errors: [], errorCount: 0 };
    (fixture.componentInstance as unknown as { previewArrived(p: ImportPreview): void }).previewArrived(preview);
    await fixture.whenStable();
    httpTesting.expectOne('/api/imports/column-maps').flush({ items: [] });
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const project = await (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Project' }))).getControl(MatSelectHarness);
    await project!.open();
    await project!.clickOptions({ text: /GX/ });
    const title = await (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Title' }))).getControl(MatInputHarness);
    await title!.setValue('Isothermal expansion from PC-3');
    const date = await (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Run date' }))).getControl(MatInputHarness);
    await date!.setValue('2026-03-14');
    const el = fixture.nativeElement as HTMLElement;
    const importButton = () => Array.from(el.querySelectorAll('button')).find((b) => b.textContent?.includes('Import'))!;
    // The process has no default: a run whose temperature rises must not be claimed isothermal unasked.
    expect(importButton().disabled).toBe(true);
    expect(el.textContent).toContain('Choose the process the run claims');
    const process = await (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Process' }))).getControl(MatSelectHarness);
    await process!.open();
    await process!.clickOptions({ text: 'isothermal' });
    return { fixture, el, importButton, loader };
  }

  it('commits the mapping as prefilled into a new draft, announces it and opens the run for editing', async () => {
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    const announce = jest.spyOn(TestBed.inject(LiveAnnouncer), 'announce').mockResolvedValue();
    const { fixture, importButton } = await withPreview();
    expect(importButton().disabled).toBe(false);
    importButton().click();
    const req = httpTesting.expectOne('/api/imports/12/commit');
    expect(req.request.body).toEqual({
      mapping: {
        time: { index: 0, unit: 's' },
        columns: [{ index: 1, channel: 'pressure', unit: 'psi', reference: 'gauge' }, { index: 2, channel: 'temperature', unit: 'degC' }],
      },
      target: { newRun: { projectId: 3, title: 'Isothermal expansion from PC-3', process: 'isothermal', runDate: '2026-03-14' } },
    });
    req.flush({ importId: 12, runId: 41, version: 1, readings: 2 });
    await fixture.whenStable();
    expect(announce).toHaveBeenCalledWith('Imported 2 readings from pc3.xlsx. The run is open for editing.');
    expect(navigate).toHaveBeenCalledWith(['/runs', 41, 'edit']);
  });

  it('carries the gas, the amount, the apparatus and the ambient conditions into the new draft, and leaves out what is empty', async () => {
    jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    const { fixture, importButton, loader } = await withPreview();
    const field = (label: string) => loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
    const gas = await (await field('Gas')).getControl(MatSelectHarness);
    await gas!.open();
    await gas!.clickOptions({ text: /Nitrogen/ });
    const apparatus = await (await field('Apparatus')).getControl(MatSelectHarness);
    await apparatus!.open();
    await apparatus!.clickOptions({ text: /PC-3/ });
    await (await (await field('Amount of gas')).getControl(MatInputHarness))!.setValue('0,042');
    await (await (await field('Ambient pressure')).getControl(MatInputHarness))!.setValue('1012.5');
    await (await (await field('Ambient temperature')).getControl(MatInputHarness))!.setValue('21.4');
    importButton().click();
    const req = httpTesting.expectOne('/api/imports/12/commit');
    expect(req.request.body.target).toEqual({
      newRun: {
        projectId: 3, title: 'Isothermal expansion from PC-3', process: 'isothermal', runDate: '2026-03-14', gasId: 4, apparatusId: 2,
        setup: {
          gas: { model: 'species', species: 'N2' },
          amount: { from: 'moles', value: 0.042 },
          ambient: { pressure: { value: 1012.5, unit: 'hPa' }, temperature: { value: 21.4, unit: 'degC' } },
        },
      },
    });
    req.flush({ importId: 12, runId: 41, version: 1, readings: 2 });
    await fixture.whenStable();
  });

  it('does not import with an amount of gas that is not a number of moles', async () => {
    const { el, importButton, loader } = await withPreview();
    const amount = await (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Amount of gas' }))).getControl(MatInputHarness);
    await amount!.setValue('-1');
    expect(importButton().disabled).toBe(true);
    expect(el.textContent).toContain('The amount of gas is a number of moles above 0');
  });

  it('replaces the readings of one of my drafts or returned runs, quoting the version the run has now', async () => {
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    const fixture = TestBed.createComponent(ImportPage);
    await fixture.whenStable();
    httpTesting.expectOne('/api/projects').flush({ items: [] });
    httpTesting.expectOne('/api/gases').flush({ items: [] });
    httpTesting.expectOne('/api/apparatus').flush({ items: [] });
    const lists = httpTesting.match((r) => r.url === '/api/runs');
    // Only one's own runs, and only those whose readings may still change.
    expect(lists.map((r) => [r.request.params.get('state'), r.request.params.get('mine')])).toEqual([
      ['draft', 'true'],
      ['returned', 'true'],
    ]);
    lists[0].flush({ items: [{ id: 41, code: 'R-2026-0041', title: 'Argon heating', state: 'draft' }], total: 1, page: 1, pageSize: 100 });
    lists[1].flush({ items: [{ id: 44, code: 'R-2026-0044', title: 'Nitrogen expansion', state: 'returned' }], total: 1, page: 1, pageSize: 100 });
    (fixture.componentInstance as unknown as { previewArrived(p: ImportPreview): void }).previewArrived({ ...PREVIEW, errors: [], errorCount: 0 });
    await fixture.whenStable();
    httpTesting.expectOne('/api/imports/column-maps').flush({ items: [] });
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    await (await loader.getHarness(MatRadioGroupHarness)).checkRadioButton({ label: /one of my drafts/ });
    const draft = await (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Draft' }))).getControl(MatSelectHarness);
    await draft!.open();
    const options = await draft!.getOptions();
    expect(await Promise.all(options.map((o) => o.getText()))).toEqual([
      'R-2026-0041: Argon heating (Draft)',
      'R-2026-0044: Nitrogen expansion (Returned)',
    ]);
    await draft!.clickOptions({ text: /R-2026-0044/ });
    const el = fixture.nativeElement as HTMLElement;
    Array.from(el.querySelectorAll('button')).find((b) => b.textContent?.includes('Import'))!.click();
    httpTesting.expectOne('/api/runs/44').flush({ id: 44, code: 'R-2026-0044', state: 'returned', version: 7 });
    const commit = httpTesting.expectOne('/api/imports/12/commit');
    expect(commit.request.body.target).toEqual({ runId: 44, version: 7 });
    commit.flush({ importId: 12, runId: 44, version: 8, readings: 2 });
    await fixture.whenStable();
    expect(navigate).toHaveBeenCalledWith(['/runs', 44, 'edit']);
  });

  it('shows the problem and every row that stopped the import', async () => {
    const { fixture, el, importButton } = await withPreview();
    importButton().click();
    httpTesting.expectOne('/api/imports/12/commit').flush(
      {
        type: 'about:blank', title: 'Bad request', status: 400,
        detail: '1 problem(s) in the rows of "pc3.xlsx"; nothing was imported. Fix them in the file or change the mapping.',
        rowErrors: [{ row: 5, column: 'T/°C', index: 2, message: 'text "warm" in a numeric column (temperature, degC)' }],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('nothing was imported');
    // One shared banner says it all: title, detail, and the rows inside the same alert
    const banner = el.querySelector('qw-problem-banner [role="alert"]');
    expect(banner?.querySelector('.problem-title')?.textContent?.trim()).toBe('Not imported.');
    expect(banner?.querySelector('.problem-detail')?.textContent).toContain('Fix them in the file or change the mapping.');
    expect(banner?.querySelector('.row-errors')?.textContent?.trim()).toBe('Row 5, column "T/°C": text "warm" in a numeric column (temperature, degC)');
    expect(el.querySelectorAll('[role="alert"]')).toHaveLength(1);
  });
});
