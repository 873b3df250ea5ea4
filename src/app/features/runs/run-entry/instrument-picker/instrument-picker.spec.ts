import { TestBed } from '@angular/core/testing';
import { FormControl } from '@angular/forms';

import { Instrument } from '../../../instruments/instruments.models';
import { InstrumentPicker, expiredOn } from './instrument-picker';

const encoder: Instrument = {
  id: 5,
  tag: 'LD-3',
  name: 'Displacement encoder',
  kind: 'displacement',
  manufacturer: 'Harrowgate mechanical workshop',
  serialNumber: 'TM-1180',
  rangeMin: 0,
  rangeMax: 200,
  unit: 'mm',
  spec: { resolution: 0.01 },
  calibration: {
    calibratedOn: '2025-10-27',
    dueOn: '2026-10-27',
    certificate: 'HIAT-CAL-2012',
    expandedUncertainty: 0.02,
    coverageFactor: 2,
    status: 'expired',
  },
};
const gauge: Instrument = { ...encoder, id: 1, tag: 'PG-2', name: 'Pressure transducer', kind: 'pressure', calibration: null };

describe('InstrumentPicker', () => {
  it('judges the calibration on the run date, not today', () => {
    expect(expiredOn(encoder, '2026-10-27')).toBe(false);
    expect(expiredOn(encoder, '2026-10-28')).toBe(true);
    expect(expiredOn(encoder, null)).toBe(true);
    expect(expiredOn(gauge, '2026-10-28')).toBe(false);
  });

  it('shows the chosen instrument with its status as icon and word, and warns when expired on the run date', async () => {
    const control = new FormControl<number | null>(5);
    const fixture = TestBed.createComponent(InstrumentPicker);
    fixture.componentRef.setInput('control', control);
    fixture.componentRef.setInput('kind', 'displacement');
    fixture.componentRef.setInput('instruments', [encoder, gauge]);
    fixture.componentRef.setInput('runDate', '2026-11-30');
    fixture.detectChanges();
    await fixture.whenStable();
    const root = fixture.nativeElement as HTMLElement;

    const chip = root.querySelector('qw-calibration-status-chip');
    expect(chip?.textContent).toContain('Expired');
    expect(chip?.querySelector('mat-icon')?.textContent?.trim()).toBe('event_busy');
    expect(root.querySelector('[role="note"]')?.textContent).toContain('LD-3 was not in calibration on the run date (due 2026-10-27). Its readings will be flagged');

    fixture.componentRef.setInput('runDate', '2026-03-14');
    fixture.detectChanges();
    await fixture.whenStable();
    expect(root.querySelector('[role="note"]')).toBeNull();

    control.setValue(null);
    fixture.detectChanges();
    await fixture.whenStable();
    expect(root.querySelector('qw-calibration-status-chip')).toBeNull();
  });
});
