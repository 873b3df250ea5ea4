import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';

import { TEXT_LIMITS } from '@contract';
import { ROLES, Role } from '../../../core/auth/auth.models';
import { RoleLabelPipe } from '../../../shared/role-label-pipe';
import { DialogSave } from '../../../shared/forms/dialog-save';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { PeopleApi } from '../people-api';
import { MIN_PASSWORD_LENGTH, PersonRecord } from '../people.models';

/** Dialog that makes an account; closes with the new person. */
@Component({
  selector: 'qw-person-form',
  imports: [
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    ProblemBanner,
    ReactiveFormsModule,
    RoleLabelPipe,
  ],
  templateUrl: './person-form.html',
  styleUrl: './person-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PersonForm {
  private readonly api = inject(PeopleApi);

  protected readonly roles = ROLES;
  protected readonly minLength = MIN_PASSWORD_LENGTH;
  protected readonly maxEmail = TEXT_LIMITS.email;
  protected readonly form = inject(FormBuilder).nonNullable.group({
    name: ['', [Validators.required, Validators.minLength(2), Validators.maxLength(TEXT_LIMITS.name)]],
    email: ['', [Validators.required, Validators.email, Validators.maxLength(TEXT_LIMITS.email)]],
    role: ['technician' as Role, Validators.required],
    password: ['', [Validators.required, Validators.minLength(MIN_PASSWORD_LENGTH)]],
  });
  protected readonly save = new DialogSave<PersonRecord>(this.form, {
    conflict: { control: this.form.controls.email, message: 'This address already has an account.' },
  });

  protected savePerson(): void {
    this.save.submit(() => {
      const value = this.form.getRawValue();
      return this.api.create({ name: value.name.trim(), email: value.email.trim(), role: value.role, password: value.password });
    });
  }
}
