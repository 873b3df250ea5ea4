import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';

import { DialogSave } from '../../../shared/forms/dialog-save';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { ApparatusApi } from '../apparatus-api';
import {
  PRESSURE_UNITS,
  PressureUnit,
  cubicMetresToLitres,
  litresToCubicMetres,
  metresToMillimetres,
  millimetresToMetres,
  pascalTo,
  pressureToPascal,
} from '../apparatus-units';
import { Apparatus, ApparatusBody } from '../apparatus.models';
import { UnitSymbolPipe } from '../../../shared/unit-symbol-pipe';

const TAG_PATTERN = /^[A-Z0-9][A-Z0-9-]{0,31}$/;
const KIND_SUGGESTIONS = ['piston-cell', 'vessel', 'bath-calorimeter'];

function orNull<T, R>(value: T | null, convert: (value: T) => R): R | null {
  return value === null ? null : convert(value);
}

/** Dialog that adds a piece of apparatus, or edits the one passed in; closes with the stored record. */
@Component({
  selector: 'qw-apparatus-form',
  imports: [
    UnitSymbolPipe,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    ProblemBanner,
    ReactiveFormsModule,
  ],
  templateUrl: './apparatus-form.html',
  styleUrl: './apparatus-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ApparatusForm {
  private readonly api = inject(ApparatusApi);
  /** null to add a new piece of apparatus. */
  protected readonly editing = inject<Apparatus | null>(MAT_DIALOG_DATA, { optional: true }) ?? null;

  protected readonly pressureUnits = PRESSURE_UNITS;
  protected readonly kindSuggestions = KIND_SUGGESTIONS;
  protected readonly form = this.buildForm(this.editing);
  private pressureUnitShown: PressureUnit = 'kPa';
  protected readonly save = new DialogSave<Apparatus>(this.form, {
    conflict: { control: this.form.controls.tag, message: 'This tag is already in the register.' },
  });

  protected saveApparatus(): void {
    this.save.submit(() => {
      const body = this.body();
      return this.editing ? this.api.update(this.editing.id, body) : this.api.create(body);
    });
  }

  /** The body in SI units: pressure in Pa, bore in m, volume in m³. */
  body(): ApparatusBody {
    const v = this.form.getRawValue();
    return {
      tag: v.tag.trim(),
      name: v.name.trim(),
      kind: v.kind.trim(),
      heatCapacity: v.heatCapacity,
      heatCapacityU: v.heatCapacityU,
      heatLossCoefficient: v.heatLossCoefficient,
      heatLossCoefficientU: v.heatLossCoefficientU,
      ratedPressure: orNull(v.ratedPressure, (p) => pressureToPascal(p, v.pressureUnit)),
      ratedPressureReference: v.ratedPressureReference,
      bore: orNull(v.bore, millimetresToMetres),
      fixedVolume: orNull(v.fixedVolume, litresToCubicMetres),
      notes: v.notes.trim(),
    };
  }

  private buildForm(from: Apparatus | null) {
    const nonNegative = Validators.min(0);
    const pressureUnit: PressureUnit = 'kPa';
    return inject(FormBuilder).nonNullable.group({
      tag: [from?.tag ?? '', [Validators.required, Validators.pattern(TAG_PATTERN)]],
      name: [from?.name ?? '', [Validators.required, Validators.minLength(3), Validators.maxLength(200)]],
      kind: [from?.kind ?? '', [Validators.required, Validators.minLength(2), Validators.maxLength(50)]],
      heatCapacity: [from?.heatCapacity ?? null, nonNegative],
      heatCapacityU: [from?.heatCapacityU ?? null, nonNegative],
      heatLossCoefficient: [from?.heatLossCoefficient ?? null, nonNegative],
      heatLossCoefficientU: [from?.heatLossCoefficientU ?? null, nonNegative],
      ratedPressure: [orNull(from?.ratedPressure ?? null, (p) => pascalTo(p, pressureUnit)), nonNegative],
      pressureUnit: [pressureUnit],
      ratedPressureReference: [from?.ratedPressureReference ?? ('absolute' as 'absolute' | 'gauge')],
      bore: [orNull(from?.bore ?? null, metresToMillimetres), nonNegative],
      fixedVolume: [orNull(from?.fixedVolume ?? null, cubicMetresToLitres), nonNegative],
      notes: [from?.notes ?? '', Validators.maxLength(2000)],
    });
  }

  /** Switching the unit keeps the pressure the same, so the number changes with it. */
  protected changePressureUnit(unit: PressureUnit): void {
    const value = this.form.controls.ratedPressure.value;
    if (value !== null && unit !== this.pressureUnitShown) {
      this.form.controls.ratedPressure.setValue(pascalTo(pressureToPascal(value, this.pressureUnitShown), unit));
    }
    this.pressureUnitShown = unit;
  }
}
