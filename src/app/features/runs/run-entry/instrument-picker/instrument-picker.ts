import { ChangeDetectionStrategy, Component, computed, effect, input, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { correctionFormula } from '@contract';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';

import { Instrument } from '../../../instruments/instruments.models';
import { CalibrationStatusChip } from '../../../../shared/calibration-status/calibration-status-chip';

/** True when the instrument's latest calibration had run out on the run date (today without one). */
export function expiredOn(instrument: Instrument, runDate: string | null): boolean {
  const calibration = instrument.calibration;
  if (!calibration) {
    return false;
  }
  return runDate ? runDate > calibration.dueOn : calibration.status === 'expired';
}

/**
 * What the check will do with the instrument's readings when the certificate in force on the run date states a
 * correction (reading × gain + offset, in the instrument's unit), in the lab's words; null otherwise: no run date,
 * no certificate, one that states none or gain 1 with offset 0, or one not in force on the run date (made after
 * it or due before it), as the server decides (server/engine/corrections.ts). The list carries only the latest
 * certificate, so a run dated before it gets no note (the check may still apply an older certificate's).
 */
export function correctionNote(instrument: Instrument, runDate: string | null): string | null {
  const calibration = instrument.calibration;
  if (!calibration || !runDate || runDate < calibration.calibratedOn || runDate > calibration.dueOn) {
    return null;
  }
  const gain = calibration.corrections.gain ?? 1;
  const offset = calibration.corrections.offset ?? 0;
  if (gain === 1 && offset === 0) {
    return null;
  }
  const formula = correctionFormula({ gain, offset, unit: instrument.unit });
  return `${instrument.tag}'s certificate ${calibration.certificate} states a correction; the check reads these values as reading ${formula}.`;
}

/**
 * Picks the register instrument that read one channel: only instruments of the channel's kind,
 * each with its calibration status as icon and word, a warning when its calibration had
 * expired on the run date, and a note when the certificate in force states a correction.
 */
@Component({
  selector: 'qw-instrument-picker',
  imports: [CalibrationStatusChip, MatFormFieldModule, MatIconModule, MatSelectModule, ReactiveFormsModule],
  template: `
    <div class="picker">
      <mat-form-field appearance="outline" subscriptSizing="dynamic">
        <mat-label>{{ label() }}</mat-label>
        <mat-select [formControl]="control()">
          <mat-option [value]="null">Not chosen</mat-option>
          @for (instrument of choices(); track instrument.id) {
            <mat-option [value]="instrument.id">
              {{ instrument.tag }} · {{ instrument.name }}
              <span class="option-status">({{ statusWord(instrument) }})</span>
            </mat-option>
          }
        </mat-select>
      </mat-form-field>
      @if (chosen(); as instrument) {
        <qw-calibration-status-chip [status]="instrument.calibration?.status ?? 'none'" />
      }
    </div>
    @if (chosen(); as instrument) {
      @if (expired()) {
        <p class="warning" role="note">
          <mat-icon aria-hidden="true">warning</mat-icon>
          <span>{{ instrument.tag }} was not in calibration on the run date{{ dueText(instrument) }}. Its readings will be flagged; use a calibrated instrument if you can.</span>
        </p>
      }
    }
    @if (correction(); as note) {
      <p class="correction" role="note">
        <mat-icon aria-hidden="true">verified</mat-icon>
        <span>{{ note }}</span>
      </p>
    }
  `,
  styles: `
    .picker {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 0.5rem;

      mat-form-field {
        flex: 1 1 16rem;
      }
    }

    .option-status {
      color: var(--mat-sys-on-surface-variant);
    }

    .warning,
    .correction {
      display: flex;
      gap: 0.5rem;
      align-items: flex-start;
      margin: 0.5rem 0 0;
      padding: 0.5rem 0.75rem;
      border-radius: var(--mat-sys-corner-small);
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
      font: var(--mat-sys-body-medium);
    }

    .correction {
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InstrumentPicker {
  readonly control = input.required<FormControl<number | null>>();
  /** Instrument kind the channel needs (pressure, volume, displacement, …). */
  readonly kind = input.required<string>();
  readonly instruments = input.required<readonly Instrument[]>();
  readonly runDate = input<string | null>(null);
  readonly label = input('Instrument');

  private readonly selectedId = signal<number | null>(null);

  constructor() {
    // Follows the control, whichever control the input hands over.
    effect((onCleanup) => {
      const control = this.control();
      this.selectedId.set(control.value);
      const subscription = control.valueChanges.subscribe((id) => this.selectedId.set(id));
      onCleanup(() => subscription.unsubscribe());
    });
  }

  protected readonly choices = computed(() => this.instruments().filter((i) => i.kind === this.kind()));
  protected readonly chosen = computed(() => {
    const id = this.selectedId();
    return this.instruments().find((i) => i.id === id) ?? null;
  });
  protected readonly expired = computed(() => {
    const instrument = this.chosen();
    return instrument ? expiredOn(instrument, this.runDate()) : false;
  });

  protected readonly correction = computed(() => {
    const instrument = this.chosen();
    return instrument ? correctionNote(instrument, this.runDate()) : null;
  });

  protected dueText(instrument: Instrument): string {
    return instrument.calibration ? ` (due ${instrument.calibration.dueOn})` : '';
  }

  protected statusWord(instrument: Instrument): string {
    const words = { valid: 'in calibration', 'due-soon': 'due soon', expired: 'expired', none: 'no calibration' };
    return words[instrument.calibration?.status ?? 'none'];
  }
}
