import { DOCUMENT } from '@angular/common';
import { DestroyRef, Injectable, Injector, afterNextRender, inject } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { NavigationEnd, Router } from '@angular/router';
import { filter, map, pairwise, startWith } from 'rxjs';

/**
 * After each navigation, moves keyboard and screen-reader focus to the new page's heading, so
 * people hear where they landed instead of staying on the link they used. The first page load
 * keeps the browser's own starting point, and a change of query alone (paging, a filter) keeps
 * focus where the person is working.
 */
@Injectable({ providedIn: 'root' })
export class HeadingFocus {
  private readonly router = inject(Router);
  private readonly document = inject(DOCUMENT);
  private readonly injector = inject(Injector);
  private started = false;

  start(destroyRef: DestroyRef): void {
    if (this.started) {
      return;
    }
    this.started = true;
    destroyRef.onDestroy(() => (this.started = false));
    this.router.events
      .pipe(
        filter((event) => event instanceof NavigationEnd),
        map((event) => pathOf(event.urlAfterRedirects)),
        startWith(null),
        pairwise(),
        filter(([before, after]) => before !== null && before !== after),
        takeUntilDestroyed(destroyRef),
      )
      .subscribe(() => afterNextRender(() => this.focusHeading(), { injector: this.injector }));
  }

  /** Focuses `main h1`; the heading becomes focusable by script only. */
  focusHeading(): void {
    const heading = this.document.querySelector<HTMLElement>('main h1');
    if (!heading) {
      return;
    }
    if (!heading.hasAttribute('tabindex')) {
      heading.setAttribute('tabindex', '-1');
    }
    heading.focus();
  }
}

function pathOf(url: string): string {
  return url.split(/[?#]/)[0];
}
