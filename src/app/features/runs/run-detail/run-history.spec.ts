import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';

import { HistoryEvent } from '../run-detail.models';
import { RunHistory } from './run-history';

describe('RunHistory', () => {
  function render(events: HistoryEvent[]): string[] {
    TestBed.configureTestingModule({ providers: [provideRouter([])] });
    const fixture = TestBed.createComponent(RunHistory);
    fixture.componentRef.setInput('runId', 7);
    fixture.componentRef.setInput('events', events);
    fixture.componentRef.setInput('revisions', []);
    fixture.componentRef.setInput('signatures', []);
    fixture.detectChanges();
    const list = (fixture.nativeElement as HTMLElement).querySelectorAll('section[aria-labelledby="history-heading"] li');
    return Array.from(list).map((li) => li.textContent!.replace(/\s+/g, ' ').trim());
  }

  const at = (time: string) => new Date(`2026-12-02T${time}`).toISOString();
  const event = (id: number, action: string, extra: Partial<HistoryEvent> = {}): HistoryEvent => ({
    id, occurredAt: at('10:14:31'), actorName: 'Lena Okonkwo', actorEmail: 'technician@lab.test', action, entityId: '7', before: null, after: null, reason: null, ...extra,
  });

  it('reads each event as a sentence: what, the state or verdict it led to, who, and when to the minute', () => {
    const lines = render([
      event(1, 'run.create', { after: { state: 'draft' } }),
      event(2, 'run.submit', { before: { state: 'draft' }, after: { state: 'submitted' } }),
      event(3, 'run.checked', { actorName: null, actorEmail: null, after: { verdict: 'breaks', En: 3.2 } }),
      event(4, 'run.return', { actorName: 'Ingrid Halvorsen', before: { state: 'submitted' }, after: { state: 'returned' }, reason: 'Barometer reading missing.' }),
      event(5, 'run.update', { before: { title: 'Expansion 1', version: 4 }, after: { title: 'Expansion 1 (repeat)', version: 5 } }),
    ]);
    // The reason sits on its own line (a block), so the text runs on without a space.
    expect(lines).toEqual([
      'Created the run (Draft) — Lena Okonkwo, 2 Dec 2026 10:14',
      'Submitted the run for review (Draft → Submitted) — Lena Okonkwo, 2 Dec 2026 10:14',
      'Checked the energy balance (Breaks) — Qwell, 2 Dec 2026 10:14',
      'Returned the run for correction with a signature (Submitted → Returned) — Ingrid Halvorsen, 2 Dec 2026 10:14Reason: Barometer reading missing.',
      // The audit trail's words for the same action (contract/audit.ts; server/audit/audit-readable.spec.ts).
      'Changed the run — Lena Okonkwo, 2 Dec 2026 10:14',
    ]);
  });
});
