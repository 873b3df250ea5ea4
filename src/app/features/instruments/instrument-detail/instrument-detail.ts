import { DatePipe, DecimalPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';

import { correctionFormula } from '@contract';
import { Auth } from '../../../core/auth/auth';
import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { CalibrationStatusChip } from '../../../shared/calibration-status/calibration-status-chip';
import { CalibrationForm, CalibrationFormData } from '../calibration-form/calibration-form';
import { InstrumentsApi } from '../instruments-api';
import { CalibrationRecord, InstrumentDetail as Detail } from '../instruments.models';
import { Confirmation } from '../../../shared/confirmation/confirmation';
import { UnitSymbolPipe } from '../../../shared/unit-symbol-pipe';

/** One instrument with its calibration history, newest first. */
@Component({
  selector: 'qw-instrument-detail',
  imports: [
    UnitSymbolPipe,
    ProblemBanner,
    CalibrationStatusChip,
    DatePipe,
    DecimalPipe,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    MatTableModule,
    RouterLink,
  ],
  templateUrl: './instrument-detail.html',
  styleUrl: './instrument-detail.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class InstrumentDetail {
  private readonly api = inject(InstrumentsApi);
  private readonly auth = inject(Auth);
  private readonly dialog = inject(MatDialog);
  private readonly confirmation = inject(Confirmation);
  private readonly destroyRef = inject(DestroyRef);

  /** Route parameter `:id`. */
  readonly id = input.required<string>();

  protected readonly columns = ['calibratedOn', 'dueOn', 'certificate', 'uncertainty', 'corrections', 'status'];
  protected readonly instrument = signal<Detail | null>(null);
  protected readonly problem = signal<ProblemDetails | null>(null);
  protected readonly canEdit = computed(() => this.auth.role() === 'quality');
  protected readonly latest = computed(() => this.instrument()?.calibrations[0] ?? null);

  constructor() {
    effect(() => {
      const id = Number(this.id());
      untracked(() => this.load(id));
    });
  }

  protected addCalibration(): void {
    const instrument = this.instrument();
    if (!instrument) {
      return;
    }
    const data: CalibrationFormData = { id: instrument.id, tag: instrument.tag, unit: instrument.unit };
    this.dialog
      .open<CalibrationForm, CalibrationFormData, CalibrationRecord>(CalibrationForm, {
        data,
        width: '40rem',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((added) => {
        if (added) {
          this.confirmation.show(`Calibration ${added.certificate} added; next due ${added.dueOn}.`);
          this.load(instrument.id);
        }
      });
  }

  protected hasCorrections(calibration: CalibrationRecord): boolean {
    return calibration.corrections.offset != null || calibration.corrections.gain != null;
  }

  /** The certificate's correction as the balance check applies it, e.g. "× 1.0004 − 0.05 °C". */
  protected correction(calibration: CalibrationRecord, unit: string): string {
    return correctionFormula({ gain: calibration.corrections.gain ?? 1, offset: calibration.corrections.offset ?? 0, unit });
  }

  private load(id: number): void {
    this.problem.set(null);
    this.api
      .get(id)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (instrument) => this.instrument.set(instrument),
        error: (error: unknown) => this.problem.set(toProblem(error)),
      });
  }
}
