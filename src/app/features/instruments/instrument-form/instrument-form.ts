import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { AbstractControl, FormBuilder, ReactiveFormsModule, ValidationErrors, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { ErrorStateMatcher } from '@angular/material/core';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { showServerFieldErrors } from '../../../shared/forms/server-field-errors';
import { InstrumentsApi } from '../instruments-api';
import {
  INSTRUMENT_KINDS,
  Instrument,
  InstrumentKind,
  InstrumentSpec,
  NewInstrument,
  UNITS_BY_KIND,
} from '../instruments.models';

/** The server's rule for tags: capitals, digits and dashes, starting with a capital or digit. */
export const TAG_PATTERN = /^[A-Z0-9][A-Z0-9-]{0,31}$/;

/** Range is optional, but when both ends are given the top must be above the bottom. */
function rangeInOrder(group: AbstractControl): ValidationErrors | null {
  const min = group.get('rangeMin')?.value as number | null;
  const max = group.get('rangeMax')?.value as number | null;
  return min !== null && max !== null && min >= max ? { rangeOrder: true } : null;
}

/** Dialog that registers an instrument; closes with the new instrument. */
@Component({
  selector: 'qw-instrument-form',
  imports: [
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
  ],
  templateUrl: './instrument-form.html',
  styleUrl: './instrument-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InstrumentForm {
  private readonly api = inject(InstrumentsApi);
  private readonly dialogRef = inject<MatDialogRef<InstrumentForm, Instrument>>(MatDialogRef);

  protected readonly kinds = INSTRUMENT_KINDS;
  private readonly fb = inject(FormBuilder).nonNullable;
  protected readonly form = this.fb.group(
    {
      tag: ['', [Validators.required, Validators.pattern(TAG_PATTERN)]],
      name: ['', [Validators.required, Validators.minLength(3), Validators.maxLength(200)]],
      kind: ['pressure' as InstrumentKind, Validators.required],
      unit: ['kPa', Validators.required],
      manufacturer: ['', Validators.maxLength(200)],
      serialNumber: ['', Validators.maxLength(100)],
      rangeMin: [null as number | null],
      rangeMax: [null as number | null],
      spec: this.fb.group({
        percentOfReading: [null as number | null, Validators.min(0)],
        percentOfFullScale: [null as number | null, Validators.min(0)],
        fullScale: [null as number | null, Validators.min(0)],
        resolution: [null as number | null, Validators.min(0)],
      }),
    },
    { validators: rangeInOrder },
  );
  private readonly kind = toSignal(this.form.controls.kind.valueChanges, {
    initialValue: this.form.controls.kind.value,
  });
  protected readonly units = computed(() => UNITS_BY_KIND[this.kind()]);
  /** The range-order error belongs to the group; this shows it on the top-of-range field. */
  protected readonly rangeMatcher: ErrorStateMatcher = {
    isErrorState: (control) =>
      !!control && control.touched && (control.invalid || this.form.hasError('rangeOrder')),
  };
  protected readonly saving = signal(false);
  protected readonly problem = signal<ProblemDetails | null>(null);
  protected readonly otherMessages = signal<string[]>([]);

  /** A new kind keeps its unit only if the unit belongs to it. */
  protected chooseKind(kind: InstrumentKind): void {
    const units = UNITS_BY_KIND[kind];
    if (!units.includes(this.form.controls.unit.value)) {
      this.form.controls.unit.setValue(units[0]);
    }
  }

  protected saveInstrument(): void {
    this.form.markAllAsTouched();
    if (this.form.invalid || this.saving()) {
      return;
    }
    this.saving.set(true);
    this.problem.set(null);
    this.api.create(this.body()).subscribe({
      next: (instrument) => this.dialogRef.close(instrument),
      error: (error: unknown) => {
        const problem = toProblem(error);
        this.saving.set(false);
        this.problem.set(problem);
        if (problem.status === 409) {
          this.form.controls.tag.setErrors({ server: 'This tag is already in the register.' });
        }
        this.otherMessages.set(showServerFieldErrors(this.form, problem));
      },
    });
  }

  /** Optional fields left empty stay out of the body, so the server keeps its own defaults. */
  private body(): NewInstrument {
    const value = this.form.getRawValue();
    const spec: InstrumentSpec = {};
    for (const [key, number] of Object.entries(value.spec)) {
      if (number !== null) {
        spec[key as keyof InstrumentSpec] = number;
      }
    }
    return {
      tag: value.tag.trim(),
      name: value.name.trim(),
      kind: value.kind,
      unit: value.unit,
      ...(value.manufacturer.trim() ? { manufacturer: value.manufacturer.trim() } : {}),
      ...(value.serialNumber.trim() ? { serialNumber: value.serialNumber.trim() } : {}),
      ...(value.rangeMin !== null ? { rangeMin: value.rangeMin } : {}),
      ...(value.rangeMax !== null ? { rangeMax: value.rangeMax } : {}),
      ...(Object.keys(spec).length ? { spec } : {}),
    };
  }
}
