import { TestBed } from '@angular/core/testing';

import { Confirmation } from './confirmation';

describe('Confirmation', () => {
  it('shows the sentence in a snack bar with a way to close it, and announces it politely', async () => {
    TestBed.inject(Confirmation).show('Calibration C-1 added; next due 2027-01-10.');
    // Material moves the sentence into the live region on a timer of its own: waited for (bounded), not slept on.
    const announced = () => document.querySelector('mat-snack-bar-container [aria-live="polite"]')?.textContent?.includes('Calibration C-1 added');
    for (let tick = 0; tick < 500 && !announced(); tick++) await new Promise((resolve) => setTimeout(resolve, 10));
    const bar = document.querySelector('mat-snack-bar-container');
    expect(bar?.textContent).toContain('Calibration C-1 added; next due 2027-01-10.');
    expect(bar?.querySelector('button')?.textContent?.trim()).toBe('OK');
    // The snack bar's own live region carries the sentence (Material moves it there for screen readers).
    expect(bar?.querySelector('[aria-live="polite"]')?.textContent).toContain('Calibration C-1 added');
  });
});
