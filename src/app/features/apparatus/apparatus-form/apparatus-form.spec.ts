import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';

import { Apparatus } from '../apparatus.models';
import { ApparatusForm } from './apparatus-form';

const pistonCell: Apparatus = {
  id: 1,
  tag: 'PC-3',
  name: 'Piston cell PC-3',
  kind: 'piston-cell',
  heatCapacity: null,
  heatCapacityU: null,
  heatLossCoefficient: 0.045,
  heatLossCoefficientU: 0.01,
  ratedPressure: 1_000_000,
  ratedPressureReference: 'gauge',
  bore: 0.05,
  fixedVolume: null,
  notes: 'Relief valve set to 900 kPa.',
};

describe('ApparatusForm', () => {
  let fixture: ComponentFixture<ApparatusForm>;
  let httpTesting: HttpTestingController;
  let close: jest.Mock;

  async function open(data: Apparatus | null): Promise<void> {
    close = jest.fn();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MatDialogRef, useValue: { close } },
        { provide: MAT_DIALOG_DATA, useValue: data },
      ],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ApparatusForm);
    await fixture.whenStable();
  }

  afterEach(() => httpTesting.verify());

  function page(): HTMLElement {
    return fixture.nativeElement as HTMLElement;
  }

  function input(label: string): HTMLInputElement {
    const found = Array.from(page().querySelectorAll('mat-form-field'))
      .find((f) => f.querySelector('mat-label')?.textContent?.trim() === label)
      ?.querySelector<HTMLInputElement>('input, textarea');
    if (!found) throw new Error(`No field labelled ${label}`);
    return found;
  }

  function type(label: string, value: string): void {
    input(label).value = value;
    input(label).dispatchEvent(new Event('input'));
  }

  async function submit(): Promise<void> {
    page().querySelector<HTMLFormElement>('form')?.dispatchEvent(new Event('submit'));
    await fixture.whenStable();
  }

  it('carries the safety note on rated pressure and heaters, deferring to local codes', async () => {
    await open(null);
    const note = page().querySelector('[role="note"]')?.textContent ?? '';
    expect(note).toContain('rated pressure');
    expect(note).toContain('Heaters');
    expect(note).toContain('local codes');
    expect(note).toContain('safety review');
  });

  it('posts a new piece of apparatus in SI: kPa to Pa, mm to m, L to m³', async () => {
    await open(null);
    type('Tag', 'VS-2');
    type('Name', 'Rigid vessel VS-2');
    type('Kind', 'vessel');
    type('Rated pressure', '1500');
    type('Piston bore', '32.5');
    type('Fixed volume', '1.2');
    type('Heat capacity', '410');
    type('u(heat capacity)', '6');
    await submit();

    const request = httpTesting.expectOne('/api/apparatus');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({
      tag: 'VS-2',
      name: 'Rigid vessel VS-2',
      kind: 'vessel',
      heatCapacity: 410,
      heatCapacityU: 6,
      heatLossCoefficient: null,
      heatLossCoefficientU: null,
      ratedPressure: 1_500_000,
      ratedPressureReference: 'absolute',
      bore: 0.0325,
      fixedVolume: 0.0012,
      notes: '',
    });
    request.flush({ ...request.request.body, id: 9 }, { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    expect(close).toHaveBeenCalledWith(expect.objectContaining({ id: 9, tag: 'VS-2' }));
  });

  it('shows a stored record in kPa, mm and L, and puts it back in SI with the unit switched to bar', async () => {
    await open(pistonCell);
    expect(input('Rated pressure').value).toBe('1000');
    expect(page().textContent).toContain('Gauge (above the barometric pressure)');
    expect(input('Piston bore').value).toBe('50');

    page().querySelector<HTMLElement>('.unit .mat-mdc-select-trigger')?.click();
    await fixture.whenStable();
    Array.from(document.querySelectorAll<HTMLElement>('mat-option'))
      .find((o) => o.textContent?.trim() === 'bar')
      ?.click();
    await fixture.whenStable();
    expect(input('Rated pressure').value).toBe('10');

    await submit();
    const request = httpTesting.expectOne('/api/apparatus/1');
    expect(request.request.method).toBe('PUT');
    expect(request.request.body).toEqual({
      tag: 'PC-3',
      name: 'Piston cell PC-3',
      kind: 'piston-cell',
      heatCapacity: null,
      heatCapacityU: null,
      heatLossCoefficient: 0.045,
      heatLossCoefficientU: 0.01,
      ratedPressure: 1_000_000,
      ratedPressureReference: 'gauge',
      bore: 0.05,
      fixedVolume: null,
      notes: 'Relief valve set to 900 kPa.',
    });
    request.flush({ ...pistonCell });
    await fixture.whenStable();
    expect(close).toHaveBeenCalled();
  });
});
