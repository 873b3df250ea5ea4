import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';

import { CalibrationForm, CalibrationFormData } from './calibration-form';

describe('CalibrationForm', () => {
  let fixture: ComponentFixture<CalibrationForm>;
  let httpTesting: HttpTestingController;
  let close: jest.Mock;
  const instrument: CalibrationFormData = { id: 5, tag: 'TC-7', unit: 'degC' };

  beforeEach(async () => {
    close = jest.fn();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MatDialogRef, useValue: { close } },
        { provide: MAT_DIALOG_DATA, useValue: instrument },
      ],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(CalibrationForm);
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
    const input = field(label).querySelector<HTMLInputElement | HTMLTextAreaElement>('input, textarea');
    if (!input) throw new Error(`No input in ${label}`);
    input.value = value;
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new Event('blur'));
  }

  async function submit(): Promise<void> {
    page().querySelector<HTMLFormElement>('form')?.dispatchEvent(new Event('submit'));
    await fixture.whenStable();
  }

  function fill(calibratedOn: string, dueOn: string): void {
    type('Calibrated on', calibratedOn);
    type('Next due on', dueOn);
    type('Certificate', 'HIAT-CAL-2402');
    type('Expanded uncertainty U', '0.04');
  }

  it("names the instrument and shows U in the instrument's unit", () => {
    expect(page().querySelector('h2')?.textContent).toContain('TC-7');
    expect(field('Expanded uncertainty U').textContent).toContain('°C');
    expect(field('Expanded uncertainty U').textContent).not.toContain('degC');
  });

  it('refuses a due date on or before the calibration date and sends nothing', async () => {
    fill('2026-11-20', '2026-11-20');
    await submit();

    expect(field('Next due on').querySelector('mat-error')?.textContent?.trim()).toBe(
      'The due date must come after the calibration date.',
    );
    httpTesting.expectNone('/api/instruments/5/calibrations');

    fill('2026-11-20', '2026-03-01');
    await submit();
    expect(field('Next due on').querySelector('mat-error')?.textContent?.trim()).toBe(
      'The due date must come after the calibration date.',
    );
    httpTesting.expectNone('/api/instruments/5/calibrations');
  });

  it('refuses a gain of 0 or less, which would erase or mirror the readings, and sends nothing', async () => {
    fill('2026-11-20', '2027-11-20');
    type('Correction gain (optional)', '0');
    await submit();

    expect(field('Correction gain (optional)').textContent).toContain('The gain is a number greater than 0 (1 for none).');
    httpTesting.expectNone('/api/instruments/5/calibrations');
  });

  it('posts the calibration with k = 2 by default and the corrections given, then closes', async () => {
    fill('2026-11-20', '2027-11-20');
    type('Correction offset (optional)', '-0.012');
    await submit();

    const request = httpTesting.expectOne('/api/instruments/5/calibrations');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({
      calibratedOn: '2026-11-20',
      dueOn: '2027-11-20',
      certificate: 'HIAT-CAL-2402',
      expandedUncertainty: 0.04,
      coverageFactor: 2,
      corrections: { offset: -0.012 },
    });
    const stored = { id: 40, certificate: 'HIAT-CAL-2402', dueOn: '2027-11-20' };
    request.flush(stored, { status: 201, statusText: 'Created' });
    await fixture.whenStable();

    expect(close).toHaveBeenCalledWith(stored);
  });

  it("shows the server's refusal beside the field it names", async () => {
    fill('2026-11-20', '2027-11-20');
    await submit();
    httpTesting.expectOne('/api/instruments/5/calibrations').flush(
      {
        type: 'about:blank',
        title: 'Bad request',
        status: 400,
        detail: 'certificate must name the certificate (2 to 100 characters)',
        errors: [{ field: 'certificate', message: 'certificate must name the certificate (2 to 100 characters)' }],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();

    expect(field('Certificate').querySelector('mat-error')?.textContent?.trim()).toBe(
      'certificate must name the certificate (2 to 100 characters)',
    );
    expect(close).not.toHaveBeenCalled();
  });
});
