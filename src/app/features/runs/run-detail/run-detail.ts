import { LiveAnnouncer } from '@angular/cdk/a11y';
import { DOCUMENT, DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import { BehaviorSubject, Observable, catchError, combineLatest, map, of, switchMap } from 'rxjs';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { BackoffPoll } from '../../../shared/polling/backoff-poll';
import { VERDICT_LOOKS, VerdictDisplay } from '../../../shared/verdict-display/verdict-display';
import { ReviewDialog, ReviewDialogData } from '../review-dialog/review-dialog';
import { RunsApi } from '../runs-api';
import { RUN_STATE_LABELS, RunState } from '../runs.models';
import { BalanceResponse, HistoryEvent, ReviewAction, RunAction, RunRecord } from '../run-detail.models';
import { CalorimetryCard } from './calorimetry-card';
import { BalanceCard } from './balance-card';
import { BudgetTable } from './budget-table';
import { CorrectionDialog } from './correction-dialog';
import { PvDiagram } from './pv-diagram';
import { gammaFor } from './pv-curves';
import { ReadingsTable } from './readings-table';
import { RunHistory } from './run-history';
import { TimeCharts } from './time-charts';
import { Confirmation } from '../../../shared/confirmation/confirmation';

const STATE_ICONS: Readonly<Record<RunState, string>> = {
  draft: 'edit_note',
  submitted: 'hourglass_top',
  approved: 'verified',
  returned: 'undo',
  rejected: 'block',
};

const DONE_WORDS: Readonly<Record<ReviewAction, string>> = {
  approve: 'approved',
  return: 'returned for correction',
  reject: 'rejected',
};

type Loaded<T> = { value: T } | { problem: ProblemDetails };

function attempt<T>(request: Observable<T>): Observable<Loaded<T>> {
  return request.pipe(
    map((value) => ({ value })),
    catchError((error: unknown) => of({ problem: toProblem(error) })),
  );
}

/** One run: summary, diagrams, energy balance with its budget, flags, readings, history and review. */
@Component({
  selector: 'qw-run-detail',
  imports: [
    ProblemBanner,
    BalanceCard,
    BudgetTable,
    CalorimetryCard,
    DatePipe,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    PvDiagram,
    ReadingsTable,
    RouterLink,
    RunHistory,
    TimeCharts,
    VerdictDisplay,
  ],
  templateUrl: './run-detail.html',
  styleUrl: './run-detail.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class RunDetail {
  private readonly api = inject(RunsApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly announcer = inject(LiveAnnouncer);
  private readonly confirmation = inject(Confirmation);
  private readonly readingsTable = viewChild(ReadingsTable);
  private readonly document = inject(DOCUMENT);
  private readonly reload$ = new BehaviorSubject<void>(undefined);
  /** Asks again while a submitted run's check is running, so the verdict appears without a reload. */
  private readonly poll = new BackoffPoll(() => this.reload$.next());
  private awaitingResult = false;

  protected readonly stateLabels = RUN_STATE_LABELS;
  protected readonly stateIcons = STATE_ICONS;

  protected readonly run = signal<RunRecord | null>(null);
  protected readonly runProblem = signal<ProblemDetails | null>(null);
  protected readonly balance = signal<BalanceResponse | null>(null);
  protected readonly balanceProblem = signal<ProblemDetails | null>(null);
  protected readonly history = signal<readonly HistoryEvent[]>([]);
  protected readonly loading = signal(true);

  protected readonly result = computed(() => this.balance()?.result ?? null);
  protected readonly documentUrl = computed(() => this.api.documentUrl(this.run()?.id ?? 0));
  protected readonly reportUrl = computed(() => this.api.reportUrl(this.run()?.id ?? 0));

  protected readonly gas = computed(() => {
    const run = this.run();
    const gas = run?.setup.gas;
    if (this.result()?.gas) {
      return this.result()!.gas;
    }
    if (gas?.model === 'species') {
      return gas.species ?? '—';
    }
    if (gas?.model === 'equipartition') {
      return `ideal gas, f = ${gas.f}`;
    }
    return gas?.model === 'calorimeter' ? 'calorimeter (no gas model)' : '—';
  });

  protected readonly pv = computed(() => {
    const series = this.run()?.series;
    return series?.P && series.V ? { P: series.P, V: series.V } : null;
  });
  protected readonly gamma = computed(() => gammaFor(this.run()?.setup ?? {}, this.result()));
  protected readonly claimedIndex = computed(() => this.result()?.process?.index ?? null);
  protected readonly fittedIndex = computed(() => this.result()?.polytropicFit?.index ?? null);

  /** Cautions for work that can hurt someone: pressure and electrical heating. */
  protected readonly safety = computed(() => {
    const run = this.run();
    if (!run) {
      return null;
    }
    const channels = run.setup.channels ?? {};
    const pressure = Boolean(channels['pressure'] || run.series?.P);
    const heated = Boolean(channels['voltage'] || channels['current'] || channels['power'] || run.series?.power);
    const rated = run.setup.apparatus?.ratedPressure;
    const highest = run.series?.P?.length ? Math.max(...run.series.P) / 1e3 : null;
    return pressure || heated ? { pressure, heated, rated, highest } : null;
  });

  /** Readings above the vessel's rated pressure (engine flag ABOVE_RATED_PRESSURE): a safety alert, not an ordinary flag. */
  protected readonly pressureAlert = computed(() => {
    const over = (this.result()?.flags ?? []).filter((flag) => flag.code === 'ABOVE_RATED_PRESSURE');
    if (over.length === 0) {
      return null;
    }
    const run = this.run();
    const peak = run?.series?.P?.length ? Math.max(...run.series.P) / 1e3 : null;
    // The flag already says the reading and the rating in kPa with their reference; its closing advice is the paragraph below.
    const first = over[0].message.split(';')[0].trim();
    return {
      count: over.reduce((n, flag) => n + (flag.reading !== null ? 1 : (flag.more ?? 0)), 0),
      first: first.endsWith('.') ? first : `${first}.`,
      apparatus: run?.setup.apparatus?.name ?? 'the vessel',
      peak,
    };
  });

  /** The actions the server's workflow table offers the signed-in person on this run, and nothing else. */
  protected readonly actions = computed((): ReadonlySet<RunAction> => new Set(this.run()?.actions ?? []));
  /** The server's word on why an investigator of the project is not offered the review yet. */
  protected readonly reviewNote = computed(() => this.run()?.reviewNote ?? null);

  constructor() {
    // Not shared: each of the three requests subscribes on its own and gets the current id at once.
    const id$ = combineLatest([inject(ActivatedRoute).paramMap, this.reload$]).pipe(map(([params]) => Number(params.get('id'))));
    id$
      .pipe(
        switchMap((id) => attempt(this.api.get(id))),
        takeUntilDestroyed(),
      )
      .subscribe((loaded) => {
        this.loading.set(false);
        if ('value' in loaded) {
          this.run.set(loaded.value);
          this.runProblem.set(null);
        } else {
          this.runProblem.set(loaded.problem);
        }
        this.followCheck();
      });
    id$
      .pipe(
        switchMap((id) => attempt(this.api.balance(id))),
        takeUntilDestroyed(),
      )
      .subscribe((loaded) => {
        this.balance.set('value' in loaded ? loaded.value : null);
        this.balanceProblem.set('problem' in loaded ? loaded.problem : null);
        this.followCheck();
      });
    id$
      .pipe(
        switchMap((id) => attempt(this.api.history(id))),
        takeUntilDestroyed(),
      )
      .subscribe((loaded) => this.history.set('value' in loaded ? loaded.value.items : []));
  }

  /**
   * While a submitted run has no current result, asks again with growing waits; once the result is
   * there, stops and announces the verdict.
   */
  private followCheck(): void {
    const run = this.run();
    const balance = this.balance();
    if (!run) {
      return;
    }
    const noResult = balance === null ? this.balanceProblem()?.status === 404 : balance.stale;
    // The run and its result are read side by side; the run may still be a step behind the result.
    const runBehind = balance !== null && !balance.stale && (!run.balance || run.balance.stale);
    const waiting = run.state === 'submitted' && (noResult || runBehind);
    if (waiting) {
      this.awaitingResult = true;
      this.poll.schedule();
      return;
    }
    this.poll.stop();
    if (this.awaitingResult && balance) {
      this.awaitingResult = false;
      const look = VERDICT_LOOKS[balance.result.verdict];
      void this.announcer.announce(`The balance check of run ${run.code} has finished: ${look.meaning}.`, 'polite');
    }
  }

  protected openReview(action: ReviewAction): void {
    const run = this.run();
    const result = this.result();
    if (!run || !result) {
      return;
    }
    const data: ReviewDialogData = { runId: run.id, code: run.code, title: run.title, version: run.version, action, result };
    this.dialog
      .open(ReviewDialog, { data, width: '38rem', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((done: ReviewAction | undefined) => {
        if (done) {
          this.confirmation.show(`Run ${run.code} ${DONE_WORDS[done]}. Your signature is recorded.`);
          this.reload$.next();
        }
      });
  }

  protected startCorrection(): void {
    const run = this.run();
    if (!run) {
      return;
    }
    this.dialog
      .open(CorrectionDialog, { data: { runId: run.id, code: run.code }, width: '34rem', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((revisionId: number | undefined) => {
        if (revisionId) {
          void this.announcer.announce(`A new draft revision of ${run.code} is open for your correction.`, 'polite');
          void this.router.navigate(['/runs', revisionId]);
        }
      });
  }

  /** Scrolls the readings table to a flagged reading and marks it. */
  protected showReading(reading: number): void {
    const table = this.readingsTable();
    table?.showReading(reading);
    this.document.getElementById('readings-heading')?.scrollIntoView({ behavior: 'smooth', block: 'start' });
    void this.announcer.announce(`Reading ${reading} is marked in the readings table.`, 'polite');
  }
}
