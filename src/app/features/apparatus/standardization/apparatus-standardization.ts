import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';

import { Auth } from '../../../core/auth/auth';
import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { Confirmation } from '../../../shared/confirmation/confirmation';
import { WithUncertaintyPipe } from '../../../shared/value-with-uncertainty/value-with-uncertainty-pipe';
import { ControlChart } from './control-chart';
import { StandardizationApi } from './standardization-api';
import { STANDARDIZATION_MEANINGS, StandardizationOverview } from './standardization.models';

/** One apparatus: its standardization series on a control chart, the standardization in force, and its history. */
@Component({
  selector: 'qw-apparatus-standardization',
  imports: [ProblemBanner, DecimalPipe, RouterLink, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, ControlChart, WithUncertaintyPipe],
  templateUrl: './apparatus-standardization.html',
  styleUrl: './apparatus-standardization.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class ApparatusStandardization {
  private readonly api = inject(StandardizationApi);
  private readonly auth = inject(Auth);
  private readonly confirmation = inject(Confirmation);
  private readonly destroyRef = inject(DestroyRef);

  /** Route parameter. */
  readonly id = input.required<string>();

  protected readonly overview = signal<StandardizationOverview | null>(null);
  protected readonly problem = signal<ProblemDetails | null>(null);
  protected readonly actionProblem = signal<ProblemDetails | null>(null);
  protected readonly isQuality = computed(() => this.auth.role() === 'quality');
  protected readonly selected = signal<ReadonlySet<number>>(new Set());
  protected readonly password = signal('');
  protected readonly reason = signal('');
  protected readonly changeText = signal('');
  protected readonly busy = signal(false);
  protected readonly meaning = STANDARDIZATION_MEANINGS[0];
  protected readonly rsdLimit = computed(() => (this.overview()?.rule.maxRsd ?? 0) * 100);
  /** The change that restarted the chart, when earlier runs exist before it. */
  protected readonly restartedAfter = computed(() => {
    const o = this.overview();
    const current = o?.segments.find((s) => s.current);
    return current?.change && o!.series.some((s) => !s.current) ? current.change : null;
  });

  ngOnInit(): void {
    this.load();
  }

  private load(): void {
    this.api.overview(Number(this.id())).pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (o) => {
        this.overview.set(o);
        this.selected.set(new Set(o.series.filter((s) => s.accepted).map((s) => s.runId)));
      },
      error: (e) => this.problem.set(toProblem(e)),
    });
  }

  protected toggle(runId: number, on: boolean): void {
    const next = new Set(this.selected());
    if (on) next.add(runId);
    else next.delete(runId);
    this.selected.set(next);
  }

  protected approve(): void {
    this.busy.set(true);
    this.actionProblem.set(null);
    const body = { runIds: [...this.selected()], password: this.password(), meaning: this.meaning, ...(this.reason().trim() ? { reason: this.reason().trim() } : {}) };
    this.api.approve(Number(this.id()), body).pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (s) => {
        this.busy.set(false);
        this.password.set('');
        this.confirmation.show(`Standardization signed: ε = ${s.energyEquivalent.value.toFixed(1)} J/K from ${s.runIds.length} runs.`);
        this.load();
      },
      error: (e) => {
        this.busy.set(false);
        this.actionProblem.set(toProblem(e));
      },
    });
  }

  protected recordChange(): void {
    this.busy.set(true);
    this.actionProblem.set(null);
    this.api.recordChange(Number(this.id()), { description: this.changeText().trim() }).pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: () => {
        this.busy.set(false);
        this.changeText.set('');
        this.confirmation.show('Change recorded: a new standardization is due.');
        this.load();
      },
      error: (e) => {
        this.busy.set(false);
        this.actionProblem.set(toProblem(e));
      },
    });
  }

  protected value(e: Event): string {
    return (e.target as HTMLInputElement).value;
  }
}
