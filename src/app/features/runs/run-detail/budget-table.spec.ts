import { BreakpointObserver } from '@angular/cdk/layout';
import { TestBed } from '@angular/core/testing';
import { of } from 'rxjs';

import { BudgetEntry } from '../run-detail.models';
import { BudgetTable } from './budget-table';

describe('BudgetTable', () => {
  const budget = [
    { source: 'amount of gas', distribution: 'normal', u: 0.0004, unit: 'mol', sensitivity: 120, share: 0.69 },
    { source: 'TC-7 calibration', distribution: 'normal', u: 0.025, unit: 'K', sensitivity: 2.1, share: 0.31 },
  ] as unknown as BudgetEntry[];

  function render(narrow: boolean) {
    TestBed.configureTestingModule({ providers: [{ provide: BreakpointObserver, useValue: { observe: () => of({ matches: narrow, breakpoints: {} }) } }] });
    const fixture = TestBed.createComponent(BudgetTable);
    fixture.componentRef.setInput('budget', budget);
    fixture.detectChanges();
    const root = fixture.nativeElement as HTMLElement;
    return { root, headers: Array.from(root.querySelectorAll('th')).map((th) => th.textContent!.trim()) };
  }

  it('shows every column in reading order on a wide screen, largest share first', () => {
    const { root, headers } = render(false);
    expect(headers).toEqual(['Source', 'Distribution', 'Standard uncertainty u', 'Sensitivity ∂r/∂x', 'Share of u²(r)']);
    expect(root.querySelector('td')?.textContent?.trim()).toBe('amount of gas');
    expect(root.querySelector('.cue')).toBeNull();
  });

  it('puts the share beside the source at phone width and says the rest is a swipe away', () => {
    const { root, headers } = render(true);
    expect(headers).toEqual(['Source', 'Share of u²(r)', 'Standard uncertainty u', 'Sensitivity ∂r/∂x', 'Distribution']);
    expect(root.querySelector('.cue')?.textContent).toContain('swipe the table sideways');
  });
});
