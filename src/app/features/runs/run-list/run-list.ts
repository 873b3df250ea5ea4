import { LiveAnnouncer } from '@angular/cdk/a11y';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { VERDICTS as CONTRACT_VERDICTS } from '@contract';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { ParamMap, RouterLink } from '@angular/router';
import { Subject, catchError, map, of } from 'rxjs';

import { Auth } from '../../../core/auth/auth';
import { ProjectsApi } from '../../projects/projects-api';
import { BackoffPoll } from '../../../shared/polling/backoff-poll';
import { VERDICT_LOOKS, Verdict, VerdictDisplay } from '../../../shared/verdict-display/verdict-display';
import { PagedList } from '../../../shared/paging/paged-list';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { RunsApi } from '../runs-api';
import { RUN_STATE_LABELS, RUN_STATES, RunPage, RunQuery, RunSort, RunState } from '../runs.models';
import { RUN_AUTHORS } from '../run-detail.models';

const DEFAULT_QUERY: RunQuery = {
  page: 1, pageSize: 25, state: null, verdict: null, project: null, author: null, mine: false, others: false, safety: null,
  from: null, to: null, sort: 'updatedAt', dir: 'desc',
};
const VERDICTS: readonly Verdict[] = CONTRACT_VERDICTS;
const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/;
const PAGE_SIZES = [10, 25, 50, 100];
const SORTS: readonly RunSort[] = ['code', 'title', 'state', 'updatedAt'];

/** Reads the list's query from the address, so home tiles, reloads and Back all land on the same view. */
export function runQueryFrom(params: ParamMap): RunQuery {
  const page = Number(params.get('page'));
  const pageSize = Number(params.get('pageSize'));
  const state = params.get('state') as RunState | null;
  const sort = params.get('sort') as RunSort | null;
  const dir = params.get('dir');
  const verdict = params.get('verdict') as Verdict | null;
  const id = (key: string) => {
    const value = Number(params.get(key));
    return Number.isInteger(value) && value > 0 ? value : null;
  };
  const day = (key: string) => {
    const value = params.get(key);
    return value && ISO_DAY.test(value) ? value : null;
  };
  return {
    page: Number.isInteger(page) && page > 0 ? page : DEFAULT_QUERY.page,
    pageSize: PAGE_SIZES.includes(pageSize) ? pageSize : DEFAULT_QUERY.pageSize,
    state: state && RUN_STATES.includes(state) ? state : null,
    verdict: verdict && VERDICTS.includes(verdict) ? verdict : null,
    project: id('project'),
    author: id('author'),
    mine: params.get('mine') === 'true',
    others: params.get('others') === 'true',
    safety: params.get('safety') === 'over-pressure' ? 'over-pressure' : null,
    from: day('from'),
    to: day('to'),
    sort: sort && SORTS.includes(sort) ? sort : DEFAULT_QUERY.sort,
    dir: dir === 'asc' || dir === 'desc' ? dir : DEFAULT_QUERY.dir,
  };
}

@Component({
  selector: 'qw-run-list',
  imports: [
    DatePipe,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
    ProblemBanner,
    RouterLink,
    VerdictDisplay,
  ],
  templateUrl: './run-list.html',
  styleUrl: './run-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class RunList {
  private readonly api = inject(RunsApi);
  private readonly announcer = inject(LiveAnnouncer);
  private readonly auth = inject(Auth);
  private readonly projectsApi = inject(ProjectsApi);

  /** Technicians, assistants and investigators write runs; quality reads them. */
  protected readonly canWriteRuns = computed(() => (RUN_AUTHORS as readonly string[]).includes(this.auth.role() ?? ''));

  protected readonly columns = [
    'code',
    'title',
    'process',
    'state',
    'verdict',
    'authorName',
    'projectName',
    'updatedAt',
  ];
  protected readonly states = RUN_STATES;
  protected readonly stateLabels = RUN_STATE_LABELS;
  protected readonly pageSizes = PAGE_SIZES;

  /** Silent re-reads of the same page while a run on it waits for its balance check. */
  private readonly refresh$ = new Subject<void>();
  private readonly poll = new BackoffPoll(() => this.refresh$.next());
  protected readonly list = new PagedList<RunQuery, RunPage>({
    queryFrom: runQueryFrom,
    defaults: DEFAULT_QUERY,
    load: (query) => this.api.list(query),
    plural: 'Runs',
    queryChanged: () => this.poll.stop(),
    refresh: this.refresh$,
    shown: (page, silent, before) => this.followChecks(page, silent, before),
  });

  protected stateLabel(state: RunState): string {
    return RUN_STATE_LABELS[state] ?? state;
  }

  /** Projects the person can see, and the people who write runs in them, for the filters. */
  protected readonly projects = toSignal(this.projectsApi.list().pipe(map((body) => body.items), catchError(() => of([]))), { initialValue: [] });
  protected readonly authors = computed(() => {
    const byId = new Map<number, { id: number; name: string }>();
    for (const project of this.projects()) {
      for (const member of project.members) {
        if ((RUN_AUTHORS as readonly string[]).includes(member.role)) byId.set(member.id, { id: member.id, name: member.name });
      }
    }
    return [...byId.values()].sort((a, b) => a.name.localeCompare(b.name));
  });
  protected readonly verdicts = VERDICTS;
  protected readonly verdictLooks = VERDICT_LOOKS;

  protected filterByState(state: RunState | null): void {
    this.list.update({ state, page: 1 });
  }

  /** Any other filter: one change at a time, back to the first page. */
  protected filterBy(change: Partial<Pick<RunQuery, 'verdict' | 'project' | 'author' | 'mine' | 'others' | 'safety' | 'from' | 'to'>>): void {
    this.list.update({ ...change, page: 1 });
  }

  /** A date input's value, or null when cleared or not a whole date. */
  protected dayOf(event: Event): string | null {
    const value = (event.target as HTMLInputElement).value;
    return ISO_DAY.test(value) ? value : null;
  }

  protected sortBy(sort: Sort): void {
    // A third click on a header clears the sort: back to the newest first.
    this.list.update(
      sort.direction === ''
        ? { sort: DEFAULT_QUERY.sort, dir: DEFAULT_QUERY.dir, page: 1 }
        : { sort: sort.active as RunSort, dir: sort.direction, page: 1 },
    );
  }

  /** Announces the verdicts that arrived on a silent re-read, and keeps asking while a run on the page waits for one. */
  private followChecks(page: RunPage, silent: boolean, before: RunPage | null): void {
    if (silent) {
      const waiting = new Set((before?.items ?? []).filter((run) => run.verdict === null).map((run) => run.id));
      const checked = page.items.filter((run) => run.verdict && waiting.has(run.id));
      if (checked.length) {
        const words = checked.map((run) => `${run.code}: ${VERDICT_LOOKS[run.verdict!].word}`).join('; ');
        void this.announcer.announce(`Balance check finished for ${words}.`, 'polite');
      }
    }
    // A submitted run without a verdict is being checked: ask again until every one on the page has its verdict.
    if (page.items.some((run) => run.state === 'submitted' && run.verdict === null)) {
      this.poll.schedule();
    } else {
      this.poll.stop();
    }
  }
}
