import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';

import { UnitKind, unitLabel, unitsOf } from '../unit-table';

/** A select of the units of one kind, bound to a form control holding the unit code. */
@Component({
  selector: 'qw-unit-picker',
  imports: [MatFormFieldModule, MatSelectModule, ReactiveFormsModule],
  template: `
    <mat-form-field appearance="outline" subscriptSizing="dynamic" class="unit-field">
      @if (showLabel()) {
        <!-- A long label overlaps a narrow unit field's outline: "Unit" shows, the full label is the accessible name. -->
        <mat-label>Unit</mat-label>
      }
      <mat-select [formControl]="control()" [aria-label]="label()">
        @for (unit of units(); track unit) {
          <mat-option [value]="unit">{{ labelOf(unit) }}</mat-option>
        }
      </mat-select>
    </mat-form-field>
  `,
  styles: `
    .unit-field {
      width: 100%;
      min-width: 6.5rem;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UnitPicker {
  readonly control = input.required<FormControl<string>>();
  readonly kind = input.required<UnitKind>();
  /** Accessible name; also the visible label unless `showLabel` is false (a column heading names it). */
  readonly label = input('Unit');
  readonly showLabel = input(true);

  protected readonly units = computed(() => unitsOf(this.kind()));
  protected readonly labelOf = unitLabel;
}
