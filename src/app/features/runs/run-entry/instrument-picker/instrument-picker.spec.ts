import { TestBed } from '@angular/core/testing';
import { FormControl } from '@angular/forms';

import { Instrument } from '../../../instruments/instruments.models';
import { InstrumentPicker, correctionNote, expiredOn } from './instrument-picker';

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
    corrections: {},
    status: 'expired',
  },
};
const gauge: Instrument = { ...encoder, id: 1, tag: 'PG-2', name: 'Pressure transducer', kind: 'pressure', calibration: null };
// A thermometer whose certificate states corrected = reading × 1.0004 − 0.05 °C (invented demo certificate; applying a
// certificate's correction to the readings is GUM, JCGM 100:2008 §3.2.3).
const thermometer: Instrument = {
  ...encoder,
  id: 9,
  tag: 'TC-9',
  name: 'Pt100 probe',
  kind: 'temperature',
  unit: 'degC',
  calibration: {
    calibratedOn: '2026-01-10',
    dueOn: '2027-01-10',
    certificate: 'HGT-CAL-2026-118',
    expandedUncertainty: 0.01,
    coverageFactor: 2,
    corrections: { gain: 1.0004, offset: -0.05 },
    status: 'valid',
  },
};
const withCorrections = (corrections: { gain?: number; offset?: number }): Instrument => ({
  ...thermometer,
  calibration: { ...thermometer.calibration!, corrections },
});

describe('InstrumentPicker', () => {
  it('judges the calibration on the run date, not today', () => {
    expect(expiredOn(encoder, '2026-10-27')).toBe(false);
    expect(expiredOn(encoder, '2026-10-28')).toBe(true);
    expect(expiredOn(encoder, null)).toBe(true);
    expect(expiredOn(gauge, '2026-10-28')).toBe(false);
  });

  it('states the correction of the certificate in force on the run date, in the instrument\'s unit symbol', () => {
    expect(correctionNote(thermometer, '2026-03-14')).toBe(
      "TC-9's certificate HGT-CAL-2026-118 states a correction; the check reads these values as reading × 1.0004 − 0.05 °C.",
    );
    expect(correctionNote(withCorrections({ offset: 0.2 }), '2026-03-14')).toBe(
      "TC-9's certificate HGT-CAL-2026-118 states a correction; the check reads these values as reading + 0.2 °C.",
    );
    expect(correctionNote(withCorrections({ gain: 0.999 }), '2026-03-14')).toBe(
      "TC-9's certificate HGT-CAL-2026-118 states a correction; the check reads these values as reading × 0.999.",
    );
    // Its first and last days count, as the check counts them (server/engine/corrections.ts certificateStatus).
    expect(correctionNote(thermometer, '2026-01-10')).not.toBeNull();
    expect(correctionNote(thermometer, '2027-01-10')).not.toBeNull();
  });

  it('says nothing when the certificate states no correction, gain 1 with offset 0, or is not in force on the run date', () => {
    expect(correctionNote(withCorrections({}), '2026-03-14')).toBeNull();
    expect(correctionNote(withCorrections({ gain: 1, offset: 0 }), '2026-03-14')).toBeNull();
    expect(correctionNote(thermometer, '2027-01-11')).toBeNull(); // due the day before
    expect(correctionNote(thermometer, '2026-01-09')).toBeNull(); // made the day after
    expect(correctionNote(thermometer, null)).toBeNull();
    expect(correctionNote(gauge, '2026-03-14')).toBeNull();
  });

  it('shows the correction note below the chosen thermometer and takes it away for a run date out of force', async () => {
    const control = new FormControl<number | null>(9);
    const fixture = TestBed.createComponent(InstrumentPicker);
    fixture.componentRef.setInput('control', control);
    fixture.componentRef.setInput('kind', 'temperature');
    fixture.componentRef.setInput('instruments', [thermometer, encoder]);
    fixture.componentRef.setInput('runDate', '2026-03-14');
    fixture.detectChanges();
    await fixture.whenStable();
    const root = fixture.nativeElement as HTMLElement;
    const note = () => root.querySelector('.correction[role="note"]');
    expect(note()?.textContent).toContain('the check reads these values as reading × 1.0004 − 0.05 °C.');
    expect(note()?.textContent).not.toContain('degC');
    expect(root.querySelector('.warning')).toBeNull();

    fixture.componentRef.setInput('runDate', '2027-02-01');
    fixture.detectChanges();
    await fixture.whenStable();
    expect(note()).toBeNull();
    expect(root.querySelector('.warning')?.textContent).toContain('TC-9 was not in calibration on the run date');

    fixture.componentRef.setInput('runDate', '2026-03-14');
    control.setValue(null);
    fixture.detectChanges();
    await fixture.whenStable();
    expect(note()).toBeNull();
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
