import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { showServerFieldErrors } from '../../../shared/forms/server-field-errors';
import { ProjectsApi } from '../projects-api';
import { Project } from '../projects.models';

/** Dialog that starts a project; closes with it. */
@Component({
  selector: 'qw-project-form',
  imports: [
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  templateUrl: './project-form.html',
  styleUrl: './project-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProjectForm {
  private readonly api = inject(ProjectsApi);
  private readonly dialogRef = inject<MatDialogRef<ProjectForm, Omit<Project, 'members'>>>(MatDialogRef);

  protected readonly form = inject(FormBuilder).nonNullable.group({
    code: ['', [Validators.required, Validators.pattern(/^[A-Z0-9]{1,12}$/)]],
    name: ['', [Validators.required, Validators.minLength(3), Validators.maxLength(200)]],
    description: ['', Validators.maxLength(2000)],
  });
  protected readonly saving = signal(false);
  protected readonly problem = signal<ProblemDetails | null>(null);
  protected readonly otherMessages = signal<string[]>([]);

  protected saveProject(): void {
    this.form.markAllAsTouched();
    if (this.form.invalid || this.saving()) {
      return;
    }
    this.saving.set(true);
    this.problem.set(null);
    const value = this.form.getRawValue();
    this.api
      .create({ code: value.code.trim(), name: value.name.trim(), description: value.description.trim() })
      .subscribe({
        next: (project) => this.dialogRef.close(project),
        error: (error: unknown) => {
          const problem = toProblem(error);
          this.saving.set(false);
          this.problem.set(problem);
          if (problem.status === 409) {
            this.form.controls.code.setErrors({ server: 'A project already has this code.' });
          }
          this.otherMessages.set(showServerFieldErrors(this.form, problem));
        },
      });
  }
}
