import { LiveAnnouncer } from '@angular/cdk/a11y';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';

import { Auth } from '../../../core/auth/auth';
import { ROLES, ROLE_LABELS, Role } from '../../../core/auth/auth.models';
import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { RoleLabelPipe } from '../../../shared/role-label-pipe';
import { PasswordReset } from '../password-reset/password-reset';
import { PeopleApi } from '../people-api';
import { PersonChange, PersonRecord } from '../people.models';
import { PersonForm } from '../person-form/person-form';
import { Confirmation } from '../../../shared/confirmation/confirmation';

@Component({
  selector: 'qw-people-list',
  imports: [
    ProblemBanner,
    DatePipe,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatProgressBarModule,
    MatTableModule,
    RoleLabelPipe,
  ],
  templateUrl: './people-list.html',
  styleUrl: './people-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class PeopleList {
  private readonly api = inject(PeopleApi);
  private readonly announcer = inject(LiveAnnouncer);
  private readonly confirmation = inject(Confirmation);
  private readonly dialog = inject(MatDialog);
  private readonly destroyRef = inject(DestroyRef);
  private readonly auth = inject(Auth);

  protected readonly columns = ['name', 'email', 'role', 'active', 'lockedUntil', 'actions'];
  protected readonly roles = ROLES;
  protected readonly people = signal<PersonRecord[] | null>(null);
  protected readonly problem = signal<ProblemDetails | null>(null);
  /** Fixed when the list arrives, so a lock that ran out shows as such. */
  protected readonly now = signal(Date.now());
  /** An administrator cannot take away their own access; the server refuses it too. */
  protected readonly myId = computed(() => this.auth.person()?.id ?? null);

  constructor() {
    this.load();
  }

  protected isLocked(person: PersonRecord): boolean {
    return person.lockedUntil !== null && Date.parse(person.lockedUntil) > this.now();
  }

  protected addPerson(): void {
    this.dialog
      .open<PersonForm, undefined, PersonRecord>(PersonForm, { width: '30rem', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((person) => {
        if (person) {
          this.done(`${person.name} can now sign in as ${ROLE_LABELS[person.role]}.`);
        }
      });
  }

  protected changeRole(person: PersonRecord, role: Role): void {
    this.change(person, { role }, `${person.name} is now ${ROLE_LABELS[role]}.`);
  }

  protected switchOff(person: PersonRecord): void {
    this.change(person, { active: false }, `${person.name}'s account is deactivated.`);
  }

  protected switchOn(person: PersonRecord): void {
    this.change(person, { active: true }, `${person.name}'s account is active again.`);
  }

  protected unlock(person: PersonRecord): void {
    this.change(person, { unlock: true }, `${person.name} can sign in again.`);
  }

  protected resetPassword(person: PersonRecord): void {
    this.dialog
      .open<PasswordReset, PersonRecord, PersonRecord>(PasswordReset, {
        data: person,
        width: '32rem',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((changed) => {
        if (changed) {
          this.done(`${changed.name} has a new password.`);
        }
      });
  }

  private change(person: PersonRecord, change: PersonChange, said: string): void {
    this.problem.set(null);
    this.api.update(person.id, change).subscribe({
      next: () => this.done(said),
      error: (error: unknown) => {
        const problem = toProblem(error);
        this.problem.set(problem);
        void this.announcer.announce(problem.detail, 'assertive');
      },
    });
  }

  private done(said: string): void {
    this.confirmation.show(said);
    this.load(false);
  }

  private load(announce = true): void {
    this.api
      .list()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (list) => {
          this.now.set(Date.now());
          this.people.set(list.items);
          if (announce) {
            void this.announcer.announce(`${list.items.length} people in this lab.`, 'polite');
          }
        },
        error: (error: unknown) => this.problem.set(toProblem(error)),
      });
  }
}
