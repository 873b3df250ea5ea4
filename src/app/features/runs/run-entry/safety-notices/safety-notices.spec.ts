import { TestBed } from '@angular/core/testing';

import { SafetyNotices } from './safety-notices';

describe('SafetyNotices', () => {
  function render(inputs: Partial<Record<'pressure' | 'heating' | 'ratedPressurePa' | 'ratedReference' | 'highestPressurePa', unknown>>) {
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
    expect(alert?.textContent).toContain('920 kPa is');
    expect(alert?.textContent).toContain('92 % of the rated pressure');
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
