import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';

import { routes } from '../../../app.routes';
import { Auth } from '../../../core/auth/auth';
import { Role } from '../../../core/auth/auth.models';
import { Instrument, InstrumentDetail } from '../instruments.models';

function instrument(id: number, tag: string, status: 'valid' | 'due-soon' | 'expired' | null): Instrument {
  return {
    id,
    tag,
    name: `Instrument ${tag}`,
    kind: 'pressure',
    manufacturer: 'Harrowgate instrument workshop',
    serialNumber: `SN-${id}`,
    rangeMin: 0,
    rangeMax: 1000,
    unit: 'kPa',
    spec: {},
    calibration: status
      ? {
          calibratedOn: '2026-01-10',
          dueOn: '2027-01-10',
          certificate: `CERT-${id}`,
          expandedUncertainty: 0.8,
          coverageFactor: 2,
          corrections: {},
          status,
        }
      : null,
  };
}

const register = [
  instrument(1, 'PG-1', 'valid'),
  instrument(2, 'PG-2', 'due-soon'),
  instrument(3, 'PG-3', 'expired'),
  instrument(4, 'PG-4', null),
];

describe('Instruments register', () => {
  let httpTesting: HttpTestingController;

  beforeAll(() => Promise.all([import('./instrument-list'), import('../instrument-detail/instrument-detail')]), 30_000);

  async function openAs(role: Role, url: string): Promise<RouterTestingHarness> {
    TestBed.configureTestingModule({
      providers: [provideRouter(routes, withComponentInputBinding()), provideHttpClient(), provideHttpClientTesting()],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    TestBed.inject(Auth).restore().subscribe();
    httpTesting.expectOne('/api/auth/me').flush({ person: { id: 4, email: `${role}@lab.test`, name: 'Sam Reyes', role } });
    const harness = await RouterTestingHarness.create();
    await harness.navigateByUrl(url);
    return harness;
  }

  afterEach(() => httpTesting.verify());

  function rows(harness: RouterTestingHarness): HTMLElement[] {
    return Array.from((harness.fixture.nativeElement as HTMLElement).querySelectorAll<HTMLElement>('tr.mat-mdc-row'));
  }

  it('marks due-soon and expired rows beyond colour: a bar, and the chip with icon and word', async () => {
    const harness = await openAs('quality', '/instruments');
    httpTesting.expectOne('/api/instruments').flush({ items: register });
    await harness.fixture.whenStable();

    const marked = rows(harness).map((row) => [
      row.querySelector('a')?.textContent?.trim(),
      row.classList.contains('attention'),
      row.querySelector('qw-calibration-status-chip mat-icon')?.textContent?.trim(),
      row.querySelector('qw-calibration-status-chip span')?.textContent?.trim(),
    ]);
    expect(marked).toEqual([
      ['PG-1', false, 'verified', 'In calibration'],
      ['PG-2', true, 'schedule', 'Due soon'],
      ['PG-3', true, 'event_busy', 'Expired'],
      ['PG-4', false, 'remove_circle_outline', 'No calibration'],
    ]);
    expect(rows(harness)[0].querySelector('a')?.getAttribute('href')).toBe('/instruments/1');
  });

  it('narrows the register to the status in the address', async () => {
    const harness = await openAs('technician', '/instruments?status=expired');
    httpTesting.expectOne('/api/instruments').flush({ items: register });
    await harness.fixture.whenStable();

    expect(rows(harness).map((row) => row.querySelector('a')?.textContent?.trim())).toEqual(['PG-3']);
  });

  it('offers Add instrument to quality officers only', async () => {
    const quality = await openAs('quality', '/instruments');
    httpTesting.expectOne('/api/instruments').flush({ items: [] });
    await quality.fixture.whenStable();
    expect((quality.fixture.nativeElement as HTMLElement).textContent).toContain('Add instrument');

    TestBed.resetTestingModule();
    const technician = await openAs('technician', '/instruments');
    httpTesting.expectOne('/api/instruments').flush({ items: [] });
    await technician.fixture.whenStable();
    expect((technician.fixture.nativeElement as HTMLElement).textContent).not.toContain('Add instrument');
  });

  it('shows one instrument with its calibration history, newest first', async () => {
    const harness = await openAs('investigator', '/instruments/2');
    const detail: InstrumentDetail = {
      ...instrument(2, 'PG-2', null),
      spec: { percentOfFullScale: 0.1, fullScale: 1000, resolution: 0.01 },
      calibrations: [
        { id: 8, calibratedOn: '2026-01-10', dueOn: '2027-01-10', certificate: 'CERT-8', expandedUncertainty: 0.8, coverageFactor: 2, corrections: { offset: -0.2 }, notes: '', status: 'due-soon' },
        { id: 5, calibratedOn: '2025-01-10', dueOn: '2026-01-10', certificate: 'CERT-5', expandedUncertainty: 1.1, coverageFactor: 2, corrections: {}, notes: 'Drift found', status: 'expired' },
      ],
    };
    httpTesting.expectOne('/api/instruments/2').flush(detail);
    await harness.fixture.whenStable();

    const root = harness.fixture.nativeElement as HTMLElement;
    expect(root.querySelector('h1')?.textContent).toContain('PG-2 · Instrument PG-2');
    expect(root.textContent).toContain('± 0.1 % of full scale');
    const history = rows(harness).map((row) => row.textContent?.replace(/\s+/g, ' ').trim());
    expect(history[0]).toContain('CERT-8');
    expect(history[0]).toContain('0.8 kPa (k = 2)');
    // The certificate's correction as the balance check applies it: reading × gain + offset (gain 1 left out).
    expect(history[0]).toContain('reading − 0.2 kPa');
    expect(history[1]).toContain('CERT-5');
    expect(history[1]).toContain('Drift found');
    // Investigators read the register; only quality officers add calibrations.
    expect(root.textContent).not.toContain('Add calibration');
  });

  it("writes a thermometer's unit as °C in its range, U and correction, and in the register", async () => {
    const thermometer: Instrument = { ...instrument(4, 'TC-4', 'valid'), kind: 'temperature', unit: 'degC', rangeMin: -20, rangeMax: 120 };
    const harness = await openAs('investigator', '/instruments/4');
    httpTesting.expectOne('/api/instruments/4').flush({
      ...thermometer,
      calibrations: [{ id: 9, calibratedOn: '2026-11-01', dueOn: '2027-11-01', certificate: 'CERT-9', expandedUncertainty: 0.01, coverageFactor: 2, corrections: { gain: 1.0004, offset: -0.05 }, notes: '', status: 'valid' }],
    } satisfies InstrumentDetail);
    await harness.fixture.whenStable();
    const text = (harness.fixture.nativeElement as HTMLElement).textContent!.replace(/\s+/g, ' ');
    // The SI brochure's symbol for the degree Celsius, never the stored code.
    expect(text).toContain('reads in °C');
    expect(text).toContain('-20 to 120 °C');
    expect(text).toContain('0.01 °C (k = 2)');
    expect(text).toContain('reading × 1.0004 − 0.05 °C');
    expect(text).not.toContain('degC');

    TestBed.resetTestingModule();
    const list = await openAs('investigator', '/instruments');
    httpTesting.expectOne('/api/instruments').flush({ items: [thermometer] });
    await list.fixture.whenStable();
    const listed = (list.fixture.nativeElement as HTMLElement).textContent!;
    expect(listed).toContain('°C');
    expect(listed).not.toContain('degC');
  });
});
