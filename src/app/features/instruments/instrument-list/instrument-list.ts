import { LiveAnnouncer } from '@angular/cdk/a11y';
import { DatePipe, DecimalPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  inject,
  input,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';

import { Auth } from '../../../core/auth/auth';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import {
  CALIBRATION_LOOKS,
  CalibrationStatus,
  CalibrationStatusChip,
} from '../../../shared/calibration-status/calibration-status-chip';
import { InstrumentForm } from '../instrument-form/instrument-form';
import { InstrumentsApi } from '../instruments-api';
import { Instrument } from '../instruments.models';
import { UnitSymbolPipe } from '../../../shared/unit-symbol-pipe';

const STATUSES = Object.keys(CALIBRATION_LOOKS) as CalibrationStatus[];

/** The register; filtered here by calibration status, since the server sends it whole. */
@Component({
  selector: 'qw-instrument-list',
  imports: [
    UnitSymbolPipe,
    ProblemBanner,
    CalibrationStatusChip,
    DatePipe,
    DecimalPipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTableModule,
    RouterLink,
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
  private readonly api = inject(InstrumentsApi);
  private readonly auth = inject(Auth);
  private readonly dialog = inject(MatDialog);
  private readonly destroyRef = inject(DestroyRef);

  /** `?status=due-soon` from a home tile narrows the register. */
  readonly status = input<string>();

  protected readonly columns = ['tag', 'name', 'kind', 'serialNumber', 'range', 'calibration', 'dueOn'];
  protected readonly statuses = STATUSES;
  protected readonly looks = CALIBRATION_LOOKS;
  protected readonly instruments = signal<Instrument[] | null>(null);
  protected readonly problem = signal<ProblemDetails | null>(null);
  /** Only quality officers keep the register. */
  protected readonly canEdit = computed(() => this.auth.role() === 'quality');

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
    this.load();
  }

  /** Due-soon and expired rows stand out; the chip in the row says why in words. */
  protected needsAttention(item: Instrument): boolean {
    const status = item.calibration?.status ?? 'none';
    return status === 'due-soon' || status === 'expired';
  }

  protected addInstrument(): void {
    this.dialog
      .open(InstrumentForm, { width: '44rem', maxWidth: '95vw', autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((created) => {
        if (created) {
          void this.announcer.announce(`Instrument ${created.tag} added to the register.`, 'polite');
          this.load();
        }
      });
  }

  private load(): void {
    this.api
      .list()
      .pipe(takeUntilDestroyed(this.destroyRef))
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
