import { TestBed } from '@angular/core/testing';

import { SafetyNotices } from './safety-notices';

describe('SafetyNotices', () => {
  type Input = 'pressure' | 'heating' | 'ratedPressurePa' | 'ratedReference' | 'highestPressurePa' | 'pressureReference' | 'ambientPressurePa';
  function render(inputs: Partial<Record<Input, unknown>>) {
    const fixture = TestBed.createComponent(SafetyNotices);
    for (const [name, value] of Object.entries(inputs)) {
      fixture.componentRef.setInput(name, value);
    }
    fixture.componentRef.setInput('apparatusName', 'Piston cell PC-3');
    fixture.detectChanges();
    return fixture.nativeElement as HTMLElement;
  }

  it('shows the apparatus rating in kPa and bar when a pressure channel is recorded', () => {
    const root = render({ pressure: true, ratedPressurePa: 1_000_000, highestPressurePa: 850_000 });
    const note = root.querySelector('[role="note"][aria-label="Pressure safety"]');
    expect(note?.textContent).toContain('Piston cell PC-3: 1,000 kPa (10 bar) absolute.');
    expect(root.querySelector('[role="alert"]')).toBeNull();
    expect(root.textContent).toContain("your lab's own safety review take precedence");
  });

  it('says when the rating is a gauge rating', () => {
    const root = render({ pressure: true, ratedPressurePa: 1_000_000, ratedReference: 'gauge', highestPressurePa: 100_000 });
    expect(root.querySelector('[aria-label="Pressure safety"]')?.textContent).toContain('1,000 kPa (10 bar) gauge.');
  });

  it('warns once a reading passes 90 % of the rating, with the reading and its share', () => {
    const root = render({ pressure: true, ratedPressurePa: 1_000_000, highestPressurePa: 920_000 });
    const alert = root.querySelector('[role="alert"]');
    expect(alert?.textContent).toContain('920 kPa absolute is');
    expect(alert?.textContent).toContain('92 % of the rated pressure');
  });

  // Absolute pressure = gauge reading + barometric pressure (common practice; the balance check's own rule).
  it('reads absolute readings against a gauge rating above the barometric pressure, as the balance check does', () => {
    // 950 kPa absolute on a 100 kPa barometer is 850 kPa gauge: 85 % of a 1,000 kPa gauge rating, no warning.
    expect(render({ pressure: true, ratedPressurePa: 1_000_000, ratedReference: 'gauge', highestPressurePa: 950_000, ambientPressurePa: 100_000 })
      .querySelector('[role="alert"]')).toBeNull();
    // 109.8 kPa absolute on a 101.35 kPa barometer is 8.45 kPa gauge: 169 % of a 5 kPa gauge rating.
    const alert = render({ pressure: true, ratedPressurePa: 5_000, ratedReference: 'gauge', highestPressurePa: 109_800, ambientPressurePa: 101_350 })
      .querySelector('[role="alert"]');
    expect(alert?.textContent).toContain('8.5 kPa gauge is 169 % of the rated pressure');
    expect(alert?.textContent).not.toContain('barometric pressure is entered');
  });

  it('adds the barometric pressure to gauge readings against an absolute rating', () => {
    const alert = render({ pressure: true, ratedPressurePa: 1_000_000, pressureReference: 'gauge', highestPressurePa: 820_000, ambientPressurePa: 100_000 })
      .querySelector('[role="alert"]');
    expect(alert?.textContent).toContain('920 kPa absolute is 92 % of the rated pressure');
  });

  it('takes the standard atmosphere (101.325 kPa, ISO 2533) until the barometric pressure is entered, and says so', () => {
    const alert = render({ pressure: true, ratedPressurePa: 100_000, ratedReference: 'gauge', highestPressurePa: 200_000 })
      .querySelector('[role="alert"]');
    // 200 − 101.325 = 98.675 kPa gauge: 99 % of 100 kPa.
    expect(alert?.textContent).toContain('98.7 kPa gauge is 99 % of the rated pressure');
    expect(alert?.textContent).toContain('Until the barometric pressure is entered, it is taken as 101.325 kPa.');
  });

  it('does not warn at exactly 90 % of the rating', () => {
    const root = render({ pressure: true, ratedPressurePa: 1_000_000, highestPressurePa: 900_000 });
    expect(root.querySelector('[role="alert"]')).toBeNull();
  });

  it('asks to guard heaters and hot surfaces when heating is recorded, and says nothing of pressure', () => {
    const root = render({ heating: true });
    expect(root.querySelector('[aria-label="Electrical heating safety"]')?.textContent).toContain(
      'Guard the heater, its leads and hot surfaces',
    );
    expect(root.querySelector('[aria-label="Pressure safety"]')).toBeNull();
  });

  it('shows nothing for a run with neither pressure nor heating', () => {
    expect(render({}).textContent?.trim()).toBe('');
  });
});
