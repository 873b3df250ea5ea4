import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

import { StandardizationApi } from './standardization-api';
import { DueApparatus } from './standardization.models';

/** The apparatus changed since their last standardization, for the investigator's and quality officer's homes. */
@Component({
  selector: 'qw-standardization-due',
  imports: [MatIconModule, RouterLink],
  template: `
    @if (items(); as items) {
      @if (items.length > 0) {
        <section class="due" aria-labelledby="due-heading">
          <h2 id="due-heading"><mat-icon aria-hidden="true">event_busy</mat-icon> Standardization due</h2>
          <ul>
            @for (a of items; track a.id) {
              <li><a [routerLink]="['/apparatus', a.id]">{{ a.tag }} · {{ a.name }}</a>: changed on {{ a.since }} ({{ a.description }}); its runs are flagged until a new standardization is signed.</li>
            }
          </ul>
        </section>
      }
    }
  `,
  styles: `
    .due { margin-top: 1.5rem; padding: 0.75rem 1rem; border-radius: var(--mat-sys-corner-small); border-inline-start: 4px solid var(--mat-sys-error); background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); }
    h2 { display: flex; gap: 0.5rem; align-items: center; margin: 0 0 0.5rem; font-size: 1.1rem; }
    ul { margin: 0; padding-inline-start: 1.25rem; }
    a { color: inherit; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StandardizationDue {
  protected readonly items = signal<DueApparatus[] | null>(null);

  constructor() {
    inject(StandardizationApi).due().pipe(takeUntilDestroyed()).subscribe({ next: (r) => this.items.set(r.items), error: () => this.items.set([]) });
  }
}
