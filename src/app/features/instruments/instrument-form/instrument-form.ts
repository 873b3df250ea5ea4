import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { AbstractControl, FormBuilder, ReactiveFormsModule, ValidationErrors, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { ErrorStateMatcher } from '@angular/material/core';
import { MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { INSTRUMENT_KINDS, INSTRUMENT_UNITS, InstrumentKind } from '@contract';

import { DialogSave } from '../../../shared/forms/dialog-save';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { InstrumentsApi } from '../instruments-api';
import { Instrument, InstrumentSpec, NewInstrument } from '../instruments.models';
import { UnitSymbolPipe } from '../../../shared/unit-symbol-pipe';

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
    UnitSymbolPipe,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    ProblemBanner,
    ReactiveFormsModule,
  ],
  templateUrl: './instrument-form.html',
  styleUrl: './instrument-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InstrumentForm {
  private readonly api = inject(InstrumentsApi);

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
  protected readonly units = computed(() => INSTRUMENT_UNITS[this.kind()]);
  /** The range-order error belongs to the group; this shows it on the top-of-range field. */
  protected readonly rangeMatcher: ErrorStateMatcher = {
    isErrorState: (control) =>
      !!control && control.touched && (control.invalid || this.form.hasError('rangeOrder')),
  };
  protected readonly save = new DialogSave<Instrument>(this.form, {
    conflict: { control: this.form.controls.tag, message: 'This tag is already in the register.' },
  });

  /** A new kind keeps its unit only if the unit belongs to it. */
  protected chooseKind(kind: InstrumentKind): void {
    const units = INSTRUMENT_UNITS[kind];
    if (!units.includes(this.form.controls.unit.value)) {
      this.form.controls.unit.setValue(units[0]);
    }
  }

  protected saveInstrument(): void {
    this.save.submit(() => this.api.create(this.body()));
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
