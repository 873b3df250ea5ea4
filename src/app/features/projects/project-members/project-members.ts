import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatListModule } from '@angular/material/list';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { map } from 'rxjs';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { DialogSave } from '../../../shared/forms/dialog-save';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { RoleLabelPipe } from '../../../shared/role-label-pipe';
import { PeopleApi } from '../../people/people-api';
import { PersonRecord } from '../../people/people.models';
import { ProjectsApi } from '../projects-api';
import { Project } from '../projects.models';

/** Dialog that picks a project's members from everyone in the lab; closes with the chosen ids. */
@Component({
  selector: 'qw-project-members',
  imports: [MatButtonModule, MatDialogModule, MatListModule, MatProgressBarModule, ProblemBanner, ReactiveFormsModule, RoleLabelPipe],
  templateUrl: './project-members.html',
  styleUrl: './project-members.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProjectMembers {
  private readonly api = inject(ProjectsApi);
  protected readonly project = inject<Project>(MAT_DIALOG_DATA);

  protected readonly people = signal<PersonRecord[] | null>(null);
  /** Why the lab's people could not be read (the save's own refusals are the save's). */
  protected readonly loadProblem = signal<ProblemDetails | null>(null);
  /** The chosen people's ids: the selection list's value. */
  protected readonly members = new FormControl<number[]>(this.project.members.map((m) => m.id), { nonNullable: true });
  protected readonly chosenCount = toSignal(this.members.valueChanges.pipe(map((ids) => ids.length)), {
    initialValue: this.members.value.length,
  });
  /** A list has no place for a field message: the server's messages all show in the alert. */
  protected readonly save = new DialogSave<number[]>(this.members);

  constructor() {
    inject(PeopleApi)
      .list()
      .subscribe({
        next: (list) => this.people.set(list.items),
        error: (error: unknown) => this.loadProblem.set(toProblem(error)),
      });
  }

  protected saveMembers(): void {
    const ids = [...this.members.value].sort((a, b) => a - b);
    this.save.submit(() => this.api.setMembers(this.project.id, ids).pipe(map((result) => result.members)));
  }
}
