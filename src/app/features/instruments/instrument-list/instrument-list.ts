import { LiveAnnouncer } from '@angular/cdk/a11y';
import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { ActivatedRoute, Router } from '@angular/router';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import {
  CALIBRATION_LOOKS,
  CalibrationStatus,
  CalibrationStatusChip,
} from '../../../shared/calibration-status/calibration-status-chip';
import { InstrumentsApi } from '../instruments-api';
import { Instrument } from '../instruments.models';

const STATUSES = Object.keys(CALIBRATION_LOOKS) as CalibrationStatus[];

/** The register; filtered here by calibration status, since the server sends it whole. */
@Component({
  selector: 'qw-instrument-list',
  imports: [
    CalibrationStatusChip,
    DatePipe,
    DecimalPipe,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTableModule,
  ],
  templateUrl: './instrument-list.html',
  styleUrl: './instrument-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class InstrumentList {
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);
  private readonly announcer = inject(LiveAnnouncer);

  /** `?status=due-soon` from a home tile narrows the register. */
  readonly status = input<string>();

  protected readonly columns = ['tag', 'name', 'kind', 'serialNumber', 'range', 'calibration', 'dueOn'];
  protected readonly statuses = STATUSES;
  protected readonly looks = CALIBRATION_LOOKS;
  protected readonly instruments = signal<Instrument[] | null>(null);
  protected readonly problem = signal<ProblemDetails | null>(null);

  protected readonly chosenStatus = computed(() => {
    const status = this.status() as CalibrationStatus | undefined;
    return status && STATUSES.includes(status) ? status : null;
  });
  protected readonly shown = computed(() => {
    const all = this.instruments() ?? [];
    const status = this.chosenStatus();
    return status ? all.filter((item) => (item.calibration?.status ?? 'none') === status) : all;
  });

  constructor() {
    inject(InstrumentsApi)
      .list()
      .pipe(takeUntilDestroyed())
      .subscribe({
        next: (list) => {
          this.instruments.set(list.items);
          void this.announcer.announce(`${list.items.length} instruments in the register.`, 'polite');
        },
        error: (error: unknown) => this.problem.set(toProblem(error)),
      });
  }

  protected filterByStatus(status: CalibrationStatus | null): void {
    void this.router.navigate([], {
      relativeTo: this.route,
      queryParams: { status },
      queryParamsHandling: 'merge',
    });
  }
}
