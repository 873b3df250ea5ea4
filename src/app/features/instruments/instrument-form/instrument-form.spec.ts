import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatDialogRef } from '@angular/material/dialog';

import { InstrumentForm } from './instrument-form';

describe('InstrumentForm', () => {
  let fixture: ComponentFixture<InstrumentForm>;
  let httpTesting: HttpTestingController;
  let close: jest.Mock;

  beforeEach(async () => {
    close = jest.fn();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MatDialogRef, useValue: { close } },
      ],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(InstrumentForm);
    await fixture.whenStable();
  });

  afterEach(() => httpTesting.verify());

  function page(): HTMLElement {
    return fixture.nativeElement as HTMLElement;
  }

  function field(label: string): HTMLElement {
    const found = Array.from(page().querySelectorAll<HTMLElement>('mat-form-field')).find(
      (f) => f.querySelector('mat-label')?.textContent?.trim() === label,
    );
    if (!found) throw new Error(`No field labelled ${label}`);
    return found;
  }

  function type(label: string, value: string): void {
    const input = field(label).querySelector<HTMLInputElement>('input');
    if (!input) throw new Error(`No input in ${label}`);
    input.value = value;
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new Event('blur'));
  }

  async function choose(label: string, option: string): Promise<void> {
    field(label).querySelector<HTMLElement>('.mat-mdc-select-trigger')?.click();
    await fixture.whenStable();
    const item = Array.from(document.querySelectorAll<HTMLElement>('mat-option')).find(
      (o) => o.textContent?.trim() === option,
    );
    if (!item) throw new Error(`No option ${option} in ${label}`);
    item.click();
    await fixture.whenStable();
  }

  async function submit(): Promise<void> {
    page().querySelector<HTMLFormElement>('form')?.dispatchEvent(new Event('submit'));
    await fixture.whenStable();
  }

  function errorOf(label: string): string | undefined {
    return field(label).querySelector('mat-error')?.textContent?.trim();
  }

  function fillValid(): void {
    type('Tag', 'PG-4');
    type('Name', 'Pressure transducer, vessel V-2');
    type('Serial number', 'KG-77120');
    type('Range from', '0');
    type('Range to', '1000');
    type('% of full scale', '0.1');
    type('Full scale', '1000');
  }

  it('says what is missing and sends nothing when required fields are empty', async () => {
    await submit();

    expect(errorOf('Tag')).toBe("Enter the lab's tag for this instrument.");
    expect(errorOf('Name')).toBe('Give a name of at least 3 characters.');
    httpTesting.expectNone('/api/instruments');
  });

  it('refuses a tag that is not capitals, digits and dashes, and a range upside down', async () => {
    fillValid();
    type('Tag', 'pg 4');
    type('Range from', '500');
    type('Range to', '100');
    await submit();

    expect(errorOf('Tag')).toBe('Use capitals, digits and dashes only, e.g. PG-4.');
    expect(errorOf('Range to')).toBe('The top of the range must be above its bottom.');
    httpTesting.expectNone('/api/instruments');
  });

  it('offers only the units of the chosen kind', async () => {
    await choose('Kind', 'temperature');
    const unitSelect = field('Unit it reads in').querySelector<HTMLElement>('mat-select');
    unitSelect?.querySelector<HTMLElement>('.mat-mdc-select-trigger')?.click();
    await fixture.whenStable();

    const panel = document.getElementById(unitSelect?.getAttribute('aria-controls') ?? '');
    const units = Array.from(panel?.querySelectorAll('mat-option') ?? []).map((o) => o.textContent?.trim());
    // Symbols as the SI brochure writes them, not the stored codes (degC, degF).
    expect(units).toEqual(['K', '°C', '°F']);
    expect(field('Unit it reads in').textContent).toContain('K');
  });

  it('posts the instrument with only the fields filled in, and closes with what the server stored', async () => {
    fillValid();
    await submit();

    const request = httpTesting.expectOne('/api/instruments');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({
      tag: 'PG-4',
      name: 'Pressure transducer, vessel V-2',
      kind: 'pressure',
      unit: 'kPa',
      serialNumber: 'KG-77120',
      rangeMin: 0,
      rangeMax: 1000,
      spec: { percentOfFullScale: 0.1, fullScale: 1000 },
    });
    const stored = { id: 11, tag: 'PG-4' };
    request.flush(stored, { status: 201, statusText: 'Created' });
    await fixture.whenStable();

    expect(close).toHaveBeenCalledWith(stored);
  });

  it("shows the server's detail for a duplicate tag (409) and marks the tag", async () => {
    fillValid();
    await submit();
    httpTesting.expectOne('/api/instruments').flush(
      {
        type: 'about:blank',
        title: 'Conflict',
        status: 409,
        detail: 'An instrument tagged PG-4 is already in the register (id 1).',
      },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();

    expect(page().querySelector('[role="alert"]')?.textContent).toContain(
      'An instrument tagged PG-4 is already in the register (id 1).',
    );
    expect(errorOf('Tag')).toBe('This tag is already in the register.');
    expect(close).not.toHaveBeenCalled();
  });

  it("puts the server's field messages beside the fields they name", async () => {
    fillValid();
    await submit();
    httpTesting.expectOne('/api/instruments').flush(
      {
        type: 'about:blank',
        title: 'Bad request',
        status: 400,
        detail: '"kPa" is not a pressure unit Qwell knows.',
        errors: [
          { field: 'unit', message: 'unknown unit' },
          { field: 'spec.fullScale', message: 'fullScale cannot be negative' },
        ],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();

    expect(errorOf('Unit it reads in')).toBe('unknown unit');
    expect(errorOf('Full scale')).toBe('fullScale cannot be negative');
  });
});
