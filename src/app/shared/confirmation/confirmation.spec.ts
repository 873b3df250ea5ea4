import { TestBed } from '@angular/core/testing';

import { Confirmation } from './confirmation';

describe('Confirmation', () => {
  it('shows the sentence in a snack bar with a way to close it, and announces it politely', async () => {
    TestBed.inject(Confirmation).show('Calibration C-1 added; next due 2027-01-10.');
    await new Promise((resolve) => setTimeout(resolve, 200));
    const bar = document.querySelector('mat-snack-bar-container');
    expect(bar?.textContent).toContain('Calibration C-1 added; next due 2027-01-10.');
    expect(bar?.querySelector('button')?.textContent?.trim()).toBe('OK');
    // The snack bar's own live region carries the sentence (Material moves it there for screen readers).
    expect(bar?.querySelector('[aria-live="polite"]')?.textContent).toContain('Calibration C-1 added');
  });
});
