import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatSelectHarness } from '@angular/material/select/testing';

import { SAMPLE_PREVIEW as PREVIEW } from '../import-preview-sample';
import { ImportMapping, ImportPreview } from '../imports.models';
import { Confirmation } from '../../../shared/confirmation/confirmation';
import { ImportMappingStep } from './import-mapping-step';

describe('ImportMappingStep', () => {
  let httpTesting: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    httpTesting = TestBed.inject(HttpTestingController);
  });

  afterEach(() => httpTesting.verify());

  async function setUp(preview: ImportPreview = PREVIEW) {
    const fixture = TestBed.createComponent(ImportMappingStep);
    const mappings: Array<ImportMapping | null> = [];
    fixture.componentInstance.mappingChange.subscribe((m) => mappings.push(m));
    fixture.componentRef.setInput('preview', preview);
    await fixture.whenStable();
    httpTesting.expectOne('/api/imports/column-maps').flush({ items: [] });
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    return { fixture, el: fixture.nativeElement as HTMLElement, mappings, loader };
  }

  it('prefills channel, unit and pressure reference from the guesses, and shows rows, summary and row errors', async () => {
    const { el, mappings, loader } = await setUp();
    const holds = await loader.getAllHarnesses(MatSelectHarness.with({ selector: '[aria-label^="What column"]' }));
    expect(await Promise.all(holds.map((s) => s.getValueText()))).toEqual(['Time', 'Pressure', 'Temperature', 'Not imported']);
    const units = await loader.getAllHarnesses(MatSelectHarness.with({ selector: '[aria-label^="Unit of column"]' }));
    expect(await Promise.all(units.map((s) => s.getValueText()))).toEqual(['s', 'psi', '°C']);
    const reference = await loader.getHarness(MatSelectHarness.with({ selector: '[aria-label^="Pressure reference"]' }));
    expect(await reference.getValueText()).toBe('gauge (above ambient)');
    expect(mappings.at(-1)).toEqual({
      time: { index: 0, unit: 's' },
      columns: [{ index: 1, channel: 'pressure', unit: 'psi', reference: 'gauge' }, { index: 2, channel: 'temperature', unit: 'degC' }],
    });
    const errorRows = Array.from(el.querySelectorAll('table.errors tbody tr')).map((tr) => tr.textContent?.trim());
    expect(errorRows).toEqual([expect.stringMatching(/^5\s*T\/°C\s*text "warm" in a numeric column/)]);
    expect(el.textContent).toContain('formulas: cached values used');
    expect(el.querySelectorAll('table.rows tbody tr')).toHaveLength(2);
  });

  it('saves the column map under a name and confirms it visibly', async () => {
    const { fixture, el } = await setUp();
    const shown = jest.spyOn(TestBed.inject(Confirmation), 'show');
    const name = el.querySelector<HTMLInputElement>('input[placeholder^="e.g. Bench logger"]')!;
    name.value = 'Bench logger BL-4';
    name.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    Array.from(el.querySelectorAll('button')).find((b) => b.textContent?.includes('Save column map'))!.click();
    const req = httpTesting.expectOne('/api/imports/column-maps');
    expect(req.request.method).toBe('POST');
    expect(req.request.body.name).toBe('Bench logger BL-4');
    req.flush({ id: 4, name: 'Bench logger BL-4', headers: [], mapping: req.request.body.mapping });
    await fixture.whenStable();
    expect(shown).toHaveBeenCalledWith('Column map "Bench logger BL-4" saved for the next file from this logger.');
  });

  it('changes a unit, asks the server to check every row, and shows the new summary', async () => {
    const { fixture, el, mappings, loader } = await setUp();
    const unit = await loader.getHarness(MatSelectHarness.with({ selector: '[aria-label="Unit of column T/°C"]' }));
    await unit.open();
    await unit.clickOptions({ text: '°F' });
    expect(mappings.at(-1)?.columns[1]).toEqual({ index: 2, channel: 'temperature', unit: 'degF' });
    expect(el.textContent).toContain('The mapping changed: check all rows');

    Array.from(el.querySelectorAll('button')).find((b) => b.textContent?.includes('Check all rows'))!.click();
    const req = httpTesting.expectOne('/api/imports/12/check');
    expect(req.request.body).toEqual({ mapping: mappings.at(-1) });
    req.flush({ errors: [], errorCount: 0, summary: { rows: 2, timeSpan: null, perChannel: { temperature: { min: 77, max: 78, unit: 'degF' } } } });
    await fixture.whenStable();
    expect(el.textContent).toContain('No problems: every row is readable.');
    expect(el.querySelector('.summary')?.textContent).toContain('77 to 78 °F');
  });

  it('moves the time channel to the column chosen for it and says what is still missing', async () => {
    const { el, mappings, loader } = await setUp();
    const notes = await loader.getHarness(MatSelectHarness.with({ selector: '[aria-label="What column Notes holds"]' }));
    await notes.open();
    await notes.clickOptions({ text: 'Time' });
    const time = await loader.getHarness(MatSelectHarness.with({ selector: '[aria-label="What column Time (s) holds"]' }));
    expect(await time.getValueText()).toBe('Not imported');
    expect(mappings.at(-1)?.time).toEqual({ index: 3, unit: 's' });
    const pressure = await loader.getHarness(MatSelectHarness.with({ selector: '[aria-label="What column p_gauge (psi) holds"]' }));
    await pressure.open();
    await pressure.clickOptions({ text: 'Not imported' });
    const temperature = await loader.getHarness(MatSelectHarness.with({ selector: '[aria-label="What column T/°C holds"]' }));
    await temperature.open();
    await temperature.clickOptions({ text: 'Not imported' });
    expect(mappings.at(-1)).toBeNull();
    expect(el.textContent).toContain('Choose at least one column of readings.');
  });

  it('shows a refused row check in the shared problem banner, with the server\'s title, detail and field messages', async () => {
    const { fixture, el } = await setUp();
    Array.from(el.querySelectorAll('button')).find((b) => b.textContent?.includes('Check all rows'))!.click();
    const detail = 'The upload this mapping belongs to has expired. Upload the file again.';
    httpTesting.expectOne('/api/imports/12/check').flush(
      { type: 'about:blank', title: 'Not found', status: 404, detail, errors: [{ field: 'mapping.columns', message: 'column 7 is not in the file' }] },
      { status: 404, statusText: 'Not Found' },
    );
    await fixture.whenStable();
    const banner = el.querySelector('qw-problem-banner [role="alert"]');
    expect(banner?.querySelector('.problem-title')?.textContent?.trim()).toBe('Not found');
    expect(banner?.querySelector('.problem-detail')?.textContent?.trim()).toBe(detail);
    expect(Array.from(banner?.querySelectorAll('.problem-fields li') ?? []).map((li) => li.textContent?.trim())).toEqual(['column 7 is not in the file']);
    expect(el.querySelectorAll('[role="alert"]')).toHaveLength(1);
  });
});
