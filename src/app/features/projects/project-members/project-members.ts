import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule, MatSelectionListChange } from '@angular/material/list';
import { MatProgressBarModule } from '@angular/material/progress-bar';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { RoleLabelPipe } from '../../../shared/role-label-pipe';
import { PeopleApi } from '../../people/people-api';
import { PersonRecord } from '../../people/people.models';
import { ProjectsApi } from '../projects-api';
import { Project } from '../projects.models';

/** Dialog that picks a project's members from everyone in the lab; closes with the chosen ids. */
@Component({
  selector: 'qw-project-members',
  imports: [MatButtonModule, MatDialogModule, MatIconModule, MatListModule, MatProgressBarModule, RoleLabelPipe],
  templateUrl: './project-members.html',
  styleUrl: './project-members.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProjectMembers {
  private readonly api = inject(ProjectsApi);
  private readonly dialogRef = inject<MatDialogRef<ProjectMembers, number[]>>(MatDialogRef);
  protected readonly project = inject<Project>(MAT_DIALOG_DATA);

  protected readonly people = signal<PersonRecord[] | null>(null);
  protected readonly chosen = signal<ReadonlySet<number>>(new Set(this.project.members.map((m) => m.id)));
  protected readonly saving = signal(false);
  protected readonly problem = signal<ProblemDetails | null>(null);

  constructor() {
    inject(PeopleApi)
      .list()
      .subscribe({
        next: (list) => this.people.set(list.items),
        error: (error: unknown) => this.problem.set(toProblem(error)),
      });
  }

  protected choose(change: MatSelectionListChange): void {
    const next = new Set(this.chosen());
    for (const option of change.options) {
      const id = option.value as number;
      if (option.selected) {
        next.add(id);
      } else {
        next.delete(id);
      }
    }
    this.chosen.set(next);
  }

  protected saveMembers(): void {
    if (this.saving()) {
      return;
    }
    this.saving.set(true);
    this.problem.set(null);
    const ids = [...this.chosen()].sort((a, b) => a - b);
    this.api.setMembers(this.project.id, ids).subscribe({
      next: (result) => this.dialogRef.close(result.members),
      error: (error: unknown) => {
        this.saving.set(false);
        this.problem.set(toProblem(error));
      },
    });
  }
}
