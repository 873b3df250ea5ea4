import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

import { DialogSave } from '../../../shared/forms/dialog-save';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { PeopleApi } from '../people-api';
import { MIN_PASSWORD_LENGTH, PersonRecord } from '../people.models';

/** Dialog that sets a new password for someone; closes with the person. */
@Component({
  selector: 'qw-password-reset',
  imports: [
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    ProblemBanner,
    ReactiveFormsModule,
  ],
  templateUrl: './password-reset.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PasswordReset {
  private readonly api = inject(PeopleApi);
  protected readonly person = inject<PersonRecord>(MAT_DIALOG_DATA);

  protected readonly minLength = MIN_PASSWORD_LENGTH;
  protected readonly form = inject(FormBuilder).nonNullable.group({
    password: ['', [Validators.required, Validators.minLength(MIN_PASSWORD_LENGTH)]],
  });
  protected readonly password = this.form.controls.password;
  protected readonly save = new DialogSave<PersonRecord>(this.form);

  protected resetPassword(): void {
    this.save.submit(() => this.api.update(this.person.id, { password: this.password.value }));
  }
}
