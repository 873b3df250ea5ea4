import { LiveAnnouncer } from '@angular/cdk/a11y';
import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';

import { Auth } from '../../../core/auth/auth';
import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { ApparatusForm } from '../apparatus-form/apparatus-form';
import { ApparatusApi } from '../apparatus-api';
import { cubicMetresToLitres, metresToMillimetres, pascalTo } from '../apparatus-units';
import { Apparatus } from '../apparatus.models';

/** The apparatus register: vessels, piston cells and calorimeters with their thermal constants. */
@Component({
  selector: 'qw-apparatus-register',
  imports: [ProblemBanner, DecimalPipe, RouterLink, MatButtonModule, MatIconModule, MatProgressBarModule, MatTableModule],
  templateUrl: './apparatus-register.html',
  styleUrl: './apparatus-register.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class ApparatusRegister {
  private readonly api = inject(ApparatusApi);
  private readonly auth = inject(Auth);
  private readonly dialog = inject(MatDialog);
  private readonly announcer = inject(LiveAnnouncer);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly apparatus = signal<Apparatus[] | null>(null);
  protected readonly problem = signal<ProblemDetails | null>(null);
  protected readonly canEdit = computed(() => this.auth.role() === 'quality');
  protected readonly columns = computed(() => [
    'tag',
    'name',
    'kind',
    'heatCapacity',
    'heatLoss',
    'ratedPressure',
    'bore',
    'fixedVolume',
    ...(this.canEdit() ? ['actions'] : []),
  ]);
  protected readonly toKilopascal = (pa: number) => pascalTo(pa, 'kPa');
  protected readonly toBar = (pa: number) => pascalTo(pa, 'bar');
  protected readonly toMillimetres = metresToMillimetres;
  protected readonly toLitres = cubicMetresToLitres;

  constructor() {
    this.load();
  }

  protected addApparatus(): void {
    this.openForm(null);
  }

  protected editApparatus(item: Apparatus): void {
    this.openForm(item);
  }

  private openForm(item: Apparatus | null): void {
    this.dialog
      .open<ApparatusForm, Apparatus | null, Apparatus>(ApparatusForm, {
        data: item,
        width: '46rem',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((saved) => {
        if (saved) {
          void this.announcer.announce(
            `${saved.tag} ${item ? 'saved' : 'added to the register'}.`,
            'polite',
          );
          this.load();
        }
      });
  }

  private load(): void {
    this.api
      .list()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (list) => this.apparatus.set(list.items),
        error: (error: unknown) => this.problem.set(toProblem(error)),
      });
  }
}
