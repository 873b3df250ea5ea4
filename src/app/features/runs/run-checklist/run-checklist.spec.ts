import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';

import { RunChecklist } from './run-checklist';

describe('RunChecklist', () => {
  let httpTesting: HttpTestingController;

  beforeEach(() => {
    jest.useFakeTimers({ advanceTimers: true });
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    httpTesting = TestBed.inject(HttpTestingController);
  });
  afterEach(() => {
    httpTesting.verify();
    jest.useRealTimers();
  });

  it('lists what the draft still lacks, and asks again after each save', async () => {
    const fixture = TestBed.createComponent(RunChecklist);
    fixture.componentRef.setInput('runId', 12);
    fixture.componentRef.setInput('savedAt', 'first');
    await fixture.whenStable();
    jest.advanceTimersByTime(200);
    httpTesting.expectOne('/api/runs/12/checklist').flush({
      runId: 12, version: 2, complete: false,
      missing: [
        { field: 'gas', label: 'Gas', message: 'Choose the gas.' },
        { field: 'readings', label: 'Readings', message: 'Enter or import the readings: this draft has none yet.' },
      ],
    });
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('h2')?.textContent).toBe('Still missing before you submit');
    expect(Array.from(el.querySelectorAll('li')).map((li) => li.querySelector('span')?.textContent?.trim())).toEqual([
      'Gas: Choose the gas.',
      'Readings: Enter or import the readings: this draft has none yet.',
    ]);

    fixture.componentRef.setInput('savedAt', 'second');
    await fixture.whenStable();
    jest.advanceTimersByTime(200);
    httpTesting.expectOne('/api/runs/12/checklist').flush({ runId: 12, version: 3, complete: true, missing: [] });
    await fixture.whenStable();
    expect(el.querySelector('h2')?.textContent).toBe('Ready to submit');
    expect(el.textContent).toContain('Everything the balance check needs is here.');
  });

  it('asks nothing before the draft exists', async () => {
    const fixture = TestBed.createComponent(RunChecklist);
    await fixture.whenStable();
    jest.advanceTimersByTime(200);
    httpTesting.expectNone('/api/runs/null/checklist');
    expect((fixture.nativeElement as HTMLElement).querySelector('section')).toBeNull();
  });
});
