import { LiveAnnouncer } from '@angular/cdk/a11y';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';

import { Auth } from '../../core/auth/auth';
import { ProblemDetails, toProblem } from '../../core/http/problem-details';
import { ProblemBanner } from '../../shared/problem-banner/problem-banner';
import { RoleLabelPipe } from '../../shared/role-label-pipe';
import { StandardizationDue } from '../apparatus/standardization/standardization-due';
import { HomeApi } from './home-api';
import { HomeQueue } from './home.models';

/** Icons per queue key; an unknown key still gets a sensible one. */
const QUEUE_ICONS: Readonly<Record<string, string>> = {
  'my-drafts': 'edit_note',
  returned: 'undo',
  'returned-to-me': 'undo',
  'to-review': 'rate_review',
  'runs-to-review': 'rate_review',
  breaking: 'report',
  'breaking-balances': 'report',
  flagged: 'flag',
  'calibrations-due': 'event_upcoming',
  'out-of-calibration': 'event_busy',
  'never-calibrated': 'help',
  'waiting-for-review': 'hourglass_top',
  'runs-waiting': 'hourglass_top',
  people: 'group',
  'locked-accounts': 'lock_person',
  'over-pressure': 'compress',
};

@Component({
  selector: 'qw-home',
  imports: [ProblemBanner, MatIconModule, MatProgressBarModule, RoleLabelPipe, RouterLink, StandardizationDue],
  templateUrl: './home.html',
  styleUrl: './home.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class Home {
  private readonly auth = inject(Auth);
  private readonly announcer = inject(LiveAnnouncer);

  protected readonly person = this.auth.person;
  protected readonly firstName = computed(() => this.person()?.name.split(/\s+/)[0] ?? '');
  protected readonly queues = signal<HomeQueue[] | null>(null);
  protected readonly problem = signal<ProblemDetails | null>(null);

  constructor() {
    inject(HomeApi)
      .summary()
      .pipe(takeUntilDestroyed())
      .subscribe({
        next: (summary) => {
          this.queues.set(summary.queues);
          const waiting = summary.queues.reduce((sum, queue) => sum + queue.count, 0);
          void this.announcer.announce(
            waiting === 0 ? 'Your queues are empty.' : `${waiting} items wait in your queues.`,
            'polite',
          );
        },
        error: (error: unknown) => this.problem.set(toProblem(error)),
      });
  }

  protected iconFor(queue: HomeQueue): string {
    return QUEUE_ICONS[queue.key] ?? 'inbox';
  }
}
