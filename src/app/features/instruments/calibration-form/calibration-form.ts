import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { AbstractControl, FormBuilder, ReactiveFormsModule, ValidationErrors, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { ErrorStateMatcher } from '@angular/material/core';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

import { DialogSave } from '../../../shared/forms/dialog-save';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { InstrumentsApi } from '../instruments-api';
import { CalibrationRecord, NewCalibration } from '../instruments.models';
import { UnitSymbolPipe } from '../../../shared/unit-symbol-pipe';

/** What the dialog needs to know about the instrument being calibrated. */
export interface CalibrationFormData {
  id: number;
  tag: string;
  unit: string;
}

/** ISO dates compare correctly as strings. */
function dueAfterCalibrated(group: AbstractControl): ValidationErrors | null {
  const calibratedOn = group.get('calibratedOn')?.value as string;
  const dueOn = group.get('dueOn')?.value as string;
  return calibratedOn && dueOn && dueOn <= calibratedOn ? { dueNotAfter: true } : null;
}

/** Dialog that adds a calibration certificate; closes with the stored calibration. */
@Component({
  selector: 'qw-calibration-form',
  imports: [
    UnitSymbolPipe,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    ProblemBanner,
    ReactiveFormsModule,
  ],
  templateUrl: './calibration-form.html',
  styleUrl: './calibration-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CalibrationForm {
  private readonly api = inject(InstrumentsApi);
  protected readonly instrument = inject<CalibrationFormData>(MAT_DIALOG_DATA);

  protected readonly form = inject(FormBuilder).nonNullable.group(
    {
      calibratedOn: ['', Validators.required],
      dueOn: ['', Validators.required],
      certificate: ['', [Validators.required, Validators.minLength(2), Validators.maxLength(100)]],
      expandedUncertainty: [null as number | null, [Validators.required, Validators.min(0)]],
      coverageFactor: [2 as number | null, [Validators.required, Validators.min(1)]],
      offset: [null as number | null],
      // A gain of 0 or less would erase or mirror the readings; the server refuses it too.
      gain: [null as number | null, Validators.min(Number.MIN_VALUE)],
      notes: ['', Validators.maxLength(2000)],
    },
    { validators: dueAfterCalibrated },
  );
  /** The order error belongs to the group; this shows it on the due-date field. */
  protected readonly dueMatcher: ErrorStateMatcher = {
    isErrorState: (control) =>
      !!control && control.touched && (control.invalid || this.form.hasError('dueNotAfter')),
  };
  protected readonly save = new DialogSave<CalibrationRecord>(this.form);

  protected saveCalibration(): void {
    this.save.submit(() => this.api.addCalibration(this.instrument.id, this.body()));
  }

  private body(): NewCalibration {
    const value = this.form.getRawValue();
    const corrections = {
      ...(value.offset !== null ? { offset: value.offset } : {}),
      ...(value.gain !== null ? { gain: value.gain } : {}),
    };
    return {
      calibratedOn: value.calibratedOn,
      dueOn: value.dueOn,
      certificate: value.certificate.trim(),
      expandedUncertainty: value.expandedUncertainty ?? 0,
      coverageFactor: value.coverageFactor ?? 2,
      ...(Object.keys(corrections).length ? { corrections } : {}),
      ...(value.notes.trim() ? { notes: value.notes.trim() } : {}),
    };
  }
}
