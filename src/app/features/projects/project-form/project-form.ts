import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

import { DialogSave } from '../../../shared/forms/dialog-save';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { ProjectsApi } from '../projects-api';
import { Project } from '../projects.models';

/** Dialog that starts a project; closes with it. */
@Component({
  selector: 'qw-project-form',
  imports: [
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    ProblemBanner,
    ReactiveFormsModule,
  ],
  templateUrl: './project-form.html',
  styleUrl: './project-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProjectForm {
  private readonly api = inject(ProjectsApi);

  protected readonly form = inject(FormBuilder).nonNullable.group({
    code: ['', [Validators.required, Validators.pattern(/^[A-Z0-9]{1,12}$/)]],
    name: ['', [Validators.required, Validators.minLength(3), Validators.maxLength(200)]],
    description: ['', Validators.maxLength(2000)],
  });
  protected readonly save = new DialogSave<Omit<Project, 'members'>>(this.form, {
    conflict: { control: this.form.controls.code, message: 'A project already has this code.' },
  });

  protected saveProject(): void {
    this.save.submit(() => {
      const value = this.form.getRawValue();
      return this.api.create({ code: value.code.trim(), name: value.name.trim(), description: value.description.trim() });
    });
  }
}
