import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { PeopleApi } from '../people-api';
import { MIN_PASSWORD_LENGTH, PersonRecord } from '../people.models';

/** Dialog that sets a new password for someone; closes with the person. */
@Component({
  selector: 'qw-password-reset',
  imports: [
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  templateUrl: './password-reset.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PasswordReset {
  private readonly api = inject(PeopleApi);
  private readonly dialogRef = inject<MatDialogRef<PasswordReset, PersonRecord>>(MatDialogRef);
  protected readonly person = inject<PersonRecord>(MAT_DIALOG_DATA);

  protected readonly minLength = MIN_PASSWORD_LENGTH;
  protected readonly form = inject(FormBuilder).nonNullable.group({
    password: ['', [Validators.required, Validators.minLength(MIN_PASSWORD_LENGTH)]],
  });
  protected readonly password = this.form.controls.password;
  protected readonly saving = signal(false);
  protected readonly problem = signal<ProblemDetails | null>(null);

  protected resetPassword(): void {
    this.password.markAsTouched();
    if (this.password.invalid || this.saving()) {
      return;
    }
    this.saving.set(true);
    this.problem.set(null);
    this.api.update(this.person.id, { password: this.password.value }).subscribe({
      next: (person) => this.dialogRef.close(person),
      error: (error: unknown) => {
        this.saving.set(false);
        this.problem.set(toProblem(error));
      },
    });
  }
}
