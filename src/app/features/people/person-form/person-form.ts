import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';

import { ROLES, Role } from '../../../core/auth/auth.models';
import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { RoleLabelPipe } from '../../../shared/role-label-pipe';
import { showServerFieldErrors } from '../../../shared/forms/server-field-errors';
import { PeopleApi } from '../people-api';
import { MIN_PASSWORD_LENGTH, PersonRecord } from '../people.models';

/** Dialog that makes an account; closes with the new person. */
@Component({
  selector: 'qw-person-form',
  imports: [
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
    RoleLabelPipe,
  ],
  templateUrl: './person-form.html',
  styleUrl: './person-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PersonForm {
  private readonly api = inject(PeopleApi);
  private readonly dialogRef = inject<MatDialogRef<PersonForm, PersonRecord>>(MatDialogRef);

  protected readonly roles = ROLES;
  protected readonly minLength = MIN_PASSWORD_LENGTH;
  protected readonly form = inject(FormBuilder).nonNullable.group({
    name: ['', [Validators.required, Validators.minLength(2), Validators.maxLength(200)]],
    email: ['', [Validators.required, Validators.email]],
    role: ['technician' as Role, Validators.required],
    password: ['', [Validators.required, Validators.minLength(MIN_PASSWORD_LENGTH)]],
  });
  protected readonly saving = signal(false);
  protected readonly problem = signal<ProblemDetails | null>(null);
  protected readonly otherMessages = signal<string[]>([]);

  protected savePerson(): void {
    this.form.markAllAsTouched();
    if (this.form.invalid || this.saving()) {
      return;
    }
    this.saving.set(true);
    this.problem.set(null);
    const value = this.form.getRawValue();
    this.api
      .create({ name: value.name.trim(), email: value.email.trim(), role: value.role, password: value.password })
      .subscribe({
        next: (person) => this.dialogRef.close(person),
        error: (error: unknown) => {
          const problem = toProblem(error);
          this.saving.set(false);
          this.problem.set(problem);
          if (problem.status === 409) {
            this.form.controls.email.setErrors({ server: 'This address already has an account.' });
          }
          this.otherMessages.set(showServerFieldErrors(this.form, problem));
        },
      });
  }
}
