import { LiveAnnouncer } from '@angular/cdk/a11y';
import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { RoleLabelPipe } from '../../../shared/role-label-pipe';
import { ProjectForm } from '../project-form/project-form';
import { ProjectMembers } from '../project-members/project-members';
import { ProjectsApi } from '../projects-api';
import { Project } from '../projects.models';

/** Projects with their members; administrators start projects and choose who is in them. */
@Component({
  selector: 'qw-project-list',
  imports: [ProblemBanner, MatButtonModule, MatIconModule, MatProgressBarModule, RoleLabelPipe],
  templateUrl: './project-list.html',
  styleUrl: './project-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class ProjectList {
  private readonly api = inject(ProjectsApi);
  private readonly dialog = inject(MatDialog);
  private readonly announcer = inject(LiveAnnouncer);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly projects = signal<Project[] | null>(null);
  protected readonly problem = signal<ProblemDetails | null>(null);

  constructor() {
    this.load();
  }

  protected createProject(): void {
    this.dialog
      .open(ProjectForm, { width: '36rem', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((project) => {
        if (project) {
          void this.announcer.announce(`Project ${project.code} created. Choose its members next.`, 'polite');
          this.load();
        }
      });
  }

  protected editMembers(project: Project): void {
    this.dialog
      .open<ProjectMembers, Project, number[]>(ProjectMembers, { data: project, width: '32rem', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((members) => {
        if (members) {
          void this.announcer.announce(`${project.code} now has ${members.length} members.`, 'polite');
          this.load();
        }
      });
  }

  private load(): void {
    this.api
      .list()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (list) => this.projects.set(list.items),
        error: (error: unknown) => this.problem.set(toProblem(error)),
      });
  }
}
