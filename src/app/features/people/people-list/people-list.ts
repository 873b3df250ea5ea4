import { LiveAnnouncer } from '@angular/cdk/a11y';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { RoleLabelPipe } from '../../../shared/role-label-pipe';
import { PeopleApi } from '../people-api';
import { PersonRecord } from '../people.models';

@Component({
  selector: 'qw-people-list',
  imports: [DatePipe, MatIconModule, MatProgressBarModule, MatTableModule, RoleLabelPipe],
  templateUrl: './people-list.html',
  styleUrl: './people-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class PeopleList {
  private readonly announcer = inject(LiveAnnouncer);

  protected readonly columns = ['name', 'email', 'role', 'active', 'lockedUntil'];
  protected readonly people = signal<PersonRecord[] | null>(null);
  protected readonly problem = signal<ProblemDetails | null>(null);
  /** Fixed when the list arrives, so a lock that ran out shows as such. */
  protected readonly now = signal(Date.now());

  constructor() {
    inject(PeopleApi)
      .list()
      .pipe(takeUntilDestroyed())
      .subscribe({
        next: (list) => {
          this.now.set(Date.now());
          this.people.set(list.items);
          void this.announcer.announce(`${list.items.length} people in this lab.`, 'polite');
        },
        error: (error: unknown) => this.problem.set(toProblem(error)),
      });
  }

  protected isLocked(person: PersonRecord): boolean {
    return person.lockedUntil !== null && Date.parse(person.lockedUntil) > this.now();
  }
}
