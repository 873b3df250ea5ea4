import { TestBed } from '@angular/core/testing';

import { Verdict, VerdictDisplay } from './verdict-display';

function render(verdict: Verdict | null): HTMLElement {
  const fixture = TestBed.createComponent(VerdictDisplay);
  fixture.componentRef.setInput('verdict', verdict);
  fixture.detectChanges();
  return fixture.nativeElement as HTMLElement;
}

describe('VerdictDisplay', () => {
  it.each([
    ['closes', 'check_circle', 'Closes'],
    ['breaks', 'cancel', 'Breaks'],
    ['indeterminate', 'help', 'Indeterminate'],
    [null, 'pending', 'Not checked'],
  ] as const)('shows %s as an icon and a word', (verdict, icon, word) => {
    const element = render(verdict);
    const iconElement = element.querySelector('mat-icon');

    expect(iconElement?.textContent?.trim()).toBe(icon);
    // The icon is decoration; the word carries the verdict for everyone.
    expect(iconElement?.getAttribute('aria-hidden')).toBe('true');
    expect(element.querySelector('.word')?.textContent?.trim()).toBe(word);
    expect(element.classList).toContain(`verdict-${verdict ?? 'none'}`);
  });

  it('gives each verdict a different icon and word, so none depends on colour', () => {
    const shown = (['closes', 'breaks', 'indeterminate', null] as const).map((verdict) =>
      render(verdict).textContent?.replace(/\s+/g, ' ').trim(),
    );
    expect(new Set(shown).size).toBe(4);
  });
});
