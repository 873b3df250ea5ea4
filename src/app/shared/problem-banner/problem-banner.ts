import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

import { ProblemDetails } from '../../core/http/problem-details';

/** A refused save, said above the form: the server's detail and the field messages no control took. */
@Component({
  selector: 'qw-problem-banner',
  imports: [MatIconModule],
  template: `
    @if (problem(); as problem) {
      <div class="page-error" role="alert">
        <mat-icon aria-hidden="true">error</mat-icon>
        <span>
          {{ problem.detail }}
          @for (message of messages(); track message) {
            <br />{{ message }}
          }
        </span>
      </div>
    }
  `,
  // No box of its own: the alert lays out as the page's or form's own child, across a form grid's columns.
  styles: `
    :host { display: contents; }
    .page-error { grid-column: 1 / -1; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProblemBanner {
  readonly problem = input.required<ProblemDetails | null>();
  readonly messages = input<readonly string[]>([]);
}
