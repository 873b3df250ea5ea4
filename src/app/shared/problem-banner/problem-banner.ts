import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

import { ProblemDetails } from '../../core/http/problem-details';

/**
 * A failed load or refused save, the one way every page shows it: a title (the page's words for what failed,
 * else the problem's own), the server's detail, the field messages, and a retry button where the page offers one.
 * Anything projected inside goes under the detail (a page's own advice).
 */
@Component({
  selector: 'qw-problem-banner',
  imports: [MatButtonModule, MatIconModule],
  template: `
    @if (problem(); as problem) {
      <div class="page-error" role="alert">
        <mat-icon aria-hidden="true">{{ icon() }}</mat-icon>
        <div class="problem-text">
          @if (shownTitle(); as title) {
            <strong class="problem-title">{{ title }}</strong>
          }
          <span class="problem-detail">{{ problem.detail }}</span>
          @if (lines().length) {
            <ul class="problem-fields">
              @for (line of lines(); track $index) {
                <li>{{ line }}</li>
              }
            </ul>
          }
          <ng-content />
          @if (retryLabel(); as label) {
            <button mat-flat-button type="button" class="problem-retry" (click)="retry.emit()">{{ label }}</button>
          }
        </div>
      </div>
    }
  `,
  // No box of its own: the alert lays out as the page's or form's own child, across a form grid's columns.
  styles: `
    :host { display: contents; }
    .page-error { grid-column: 1 / -1; }
    .problem-text { display: flex; flex-direction: column; align-items: flex-start; gap: 0.25rem; min-width: 0; }
    .problem-fields { margin: 0; padding-inline-start: 1.25rem; }
    .problem-retry { margin-top: 0.25rem; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProblemBanner {
  readonly problem = input.required<ProblemDetails | null>();
  /** What failed, in the page's words ("The gases could not be loaded."); without it the problem's own title. */
  readonly heading = input<string | null>(null);
  /**
   * The field messages to list; without it, every field message of the problem. A form that puts some
   * beside their fields passes the rest (DialogSave.otherMessages), which may be none.
   */
  readonly messages = input<readonly string[] | null>(null);
  /** The label of the page's retry button; no button without it. */
  readonly retryLabel = input<string | null>(null);
  readonly icon = input('error');
  readonly retry = output<void>();

  protected readonly shownTitle = computed(() => {
    const problem = this.problem();
    const title = this.heading() ?? problem?.title ?? '';
    // A problem made on this side has its detail as title too: say it once.
    return title && title !== problem?.detail ? title : null;
  });

  /** The field messages, less any the detail already says (a refusal's detail often joins them). */
  protected readonly lines = computed(() => {
    const detail = this.problem()?.detail ?? '';
    return (this.messages() ?? this.problem()?.errors?.map((e) => e.message) ?? []).filter((line) => !detail.includes(line));
  });
}
