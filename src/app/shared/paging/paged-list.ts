import { LiveAnnouncer } from '@angular/cdk/a11y';
import { Signal, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { PageEvent } from '@angular/material/paginator';
import { ActivatedRoute, ParamMap, Router } from '@angular/router';
import { EMPTY, Observable, catchError, distinctUntilChanged, map, merge, of, switchMap, tap } from 'rxjs';

import { ProblemDetails, toProblem } from '../../core/http/problem-details';
import { addressParams, pageRangeMessage } from './paged-query';

/** What every paged list query has; page is 1-based. */
export interface PageQuery {
  page: number;
  pageSize: number;
}

/** What every paged list answer has. */
export interface PageOf<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

export interface PagedListOptions<Q extends PageQuery, P extends PageOf<unknown>> {
  /** Reads the query from the address; anything garbled falls back to the defaults. */
  queryFrom: (params: ParamMap) => Q;
  /** The query of a bare address: values equal to these are left out of links. */
  defaults: Q;
  /** Asks the server for one page. */
  load: (query: Q) => Observable<P>;
  /** What the list holds, for "Runs 26 to 50 of 112 shown." */
  plural: string;
  /** Called when the address names another query, before that page loads. */
  queryChanged?: (query: Q) => void;
  /** Each emission reads the current page again, silently: no loading bar, no page announcement. */
  refresh?: Observable<unknown>;
  /** Called after each page is shown, with the page shown before it. */
  shown?: (page: P, silent: boolean, before: P | null) => void;
}

/**
 * A server-paged list whose query lives in the address, so links, reloads and Back all land on the same view:
 * the address is read into a query, each new query loads its page (a newer one cancels an older one, and a
 * failed page leaves the next one free to load), and changes are made by navigating. Make it in a field
 * initializer: it injects the route, the router and the announcer.
 */
export class PagedList<Q extends PageQuery, P extends PageOf<unknown>> {
  private readonly route = inject(ActivatedRoute);
  private readonly router = inject(Router);
  private readonly announcer = inject(LiveAnnouncer);
  private readonly shownPage = signal<P | null>(null);
  private readonly loadingNow = signal(true);
  private readonly refusal = signal<ProblemDetails | null>(null);

  /** The query the address names now. */
  readonly query: Signal<Q>;
  /** The page last shown; null before the first arrives. */
  readonly result = this.shownPage.asReadonly();
  readonly loading = this.loadingNow.asReadonly();
  /** Why the last page could not be read, or null. */
  readonly problem = this.refusal.asReadonly();

  constructor(private readonly options: PagedListOptions<Q, P>) {
    this.query = toSignal(this.route.queryParamMap.pipe(map(options.queryFrom)), { requireSync: true });
    const queries = this.route.queryParamMap.pipe(
      map(options.queryFrom),
      distinctUntilChanged((a, b) => JSON.stringify(a) === JSON.stringify(b)),
      tap((query) => {
        this.loadingNow.set(true);
        options.queryChanged?.(query);
      }),
      map((query) => ({ query, silent: false })),
    );
    const refreshes = (options.refresh ?? EMPTY).pipe(map(() => ({ query: this.query(), silent: true })));
    merge(queries, refreshes)
      .pipe(
        // Errors are caught per request so that the next filter or page still loads.
        switchMap(({ query, silent }) =>
          options.load(query).pipe(
            map((page): P | ProblemDetails => page),
            catchError((error: unknown) => of(toProblem(error))),
            map((outcome) => ({ outcome, silent })),
          ),
        ),
        takeUntilDestroyed(),
      )
      .subscribe(({ outcome, silent }) => ('items' in outcome ? this.show(outcome, silent) : this.fail(outcome)));
  }

  /** Puts a changed query in the address (defaults left out); the list follows the address. */
  update(change: Partial<Q>): void {
    const queryParams = addressParams<Q>({ ...this.query(), ...change }, this.options.defaults);
    void this.router.navigate([], { relativeTo: this.route, queryParams, queryParamsHandling: 'merge' });
  }

  /** The paginator's page or page size. */
  turnPage(event: PageEvent): void {
    this.update({ page: event.pageIndex + 1, pageSize: event.pageSize } as Partial<Q>);
  }

  private show(page: P, silent: boolean): void {
    const before = this.shownPage();
    this.shownPage.set(page);
    this.refusal.set(null);
    this.loadingNow.set(false);
    if (!silent) {
      void this.announcer.announce(pageRangeMessage(page, this.options.plural), 'polite');
    }
    this.options.shown?.(page, silent, before);
  }

  private fail(problem: ProblemDetails): void {
    this.refusal.set(problem);
    this.loadingNow.set(false);
  }
}
