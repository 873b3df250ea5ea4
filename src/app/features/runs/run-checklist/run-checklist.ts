import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { catchError, debounceTime, distinctUntilChanged, map, of, switchMap } from 'rxjs';

import { RunsApi } from '../runs-api';
import { RunChecklistResponse } from '../run-entry.models';

/**
 * What a draft still lacks before it can be submitted, as the server would say on submit, in the
 * form's words. Asked again whenever `savedAt` changes (each autosave), so ticked items drop off.
 */
@Component({
  selector: 'qw-run-checklist',
  imports: [MatIconModule],
  template: `
    @if (checklist(); as list) {
      <section class="checklist" [class.complete]="list.complete" aria-labelledby="checklist-heading">
        <h2 id="checklist-heading">{{ list.complete ? 'Ready to submit' : 'Still missing before you submit' }}</h2>
        @if (list.complete) {
          <p><mat-icon aria-hidden="true">task_alt</mat-icon><span>Everything the balance check needs is here.</span></p>
        } @else {
          <ul>
            @for (item of list.missing; track item.message) {
              <li>
                <mat-icon aria-hidden="true">radio_button_unchecked</mat-icon>
                <span><strong>{{ item.label }}:</strong> {{ item.message }}</span>
              </li>
            }
          </ul>
        }
      </section>
    }
  `,
  styles: `
    .checklist {
      margin: 0 0 1rem;
      padding: 0.75rem 1rem;
      border-radius: var(--mat-sys-corner-medium);
      border-left: 4px solid var(--mat-sys-tertiary);
      background: var(--mat-sys-surface-container);
    }
    .checklist.complete {
      border-left-color: var(--mat-sys-primary);
    }
    h2 {
      margin: 0 0 0.5rem;
      font: var(--mat-sys-title-medium);
    }
    ul {
      margin: 0;
      padding: 0;
      list-style: none;
    }
    li,
    p {
      display: flex;
      gap: 0.5rem;
      align-items: flex-start;
      margin: 0.25rem 0;
    }
    mat-icon {
      flex: none;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RunChecklist {
  private readonly api = inject(RunsApi);

  readonly runId = input<number | null>(null);
  /** Changes after each save; any value will do. */
  readonly savedAt = input<unknown>(null);

  private readonly key = computed(() => ({ id: this.runId(), saved: this.savedAt() }));

  protected readonly checklist = toSignal(
    toObservable(this.key).pipe(
      distinctUntilChanged((a, b) => a.id === b.id && a.saved === b.saved),
      debounceTime(150),
      switchMap(({ id }) =>
        id === null ? of(null) : this.api.checklist(id).pipe(catchError(() => of(null as RunChecklistResponse | null))),
      ),
      map((list) => list ?? null),
    ),
    { initialValue: null },
  );
}
