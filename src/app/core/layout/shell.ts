import { BreakpointObserver } from '@angular/cdk/layout';
import { LiveAnnouncer } from '@angular/cdk/a11y';
import { DOCUMENT, Location } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  inject,
  signal,
  viewChild,
} from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatSidenav, MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { NavigationEnd, Router, RouterLink, RouterOutlet } from '@angular/router';
import { filter, map } from 'rxjs';

import { RoleLabelPipe } from '../../shared/role-label-pipe';
import { Auth } from '../auth/auth';
import { HeadingFocus } from './heading-focus';
import { navigationFor } from './navigation';

/** Below this width the navigation slides over the page instead of standing beside it. */
export const NARROW_QUERY = '(max-width: 899.98px)';

@Component({
  selector: 'qw-shell',
  imports: [
    MatButtonModule,
    MatIconModule,
    MatListModule,
    MatSidenavModule,
    MatToolbarModule,
    RoleLabelPipe,
    RouterLink,
    RouterOutlet,
  ],
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Shell {
  private readonly auth = inject(Auth);
  private readonly router = inject(Router);
  private readonly announcer = inject(LiveAnnouncer);
  private readonly document = inject(DOCUMENT);
  private readonly sidenav = viewChild.required(MatSidenav);

  protected readonly person = this.auth.person;
  protected readonly entries = computed(() => navigationFor(this.auth.role()));

  /** The address, from router navigations and from pages that rewrite it in place (a new draft's first save). */
  private readonly url = signal(this.router.url);

  /** The entry whose path is the longest prefix of the address: /runs/new marks "New run", not "Runs" too. */
  protected readonly activePath = computed(() => {
    const path = this.url().split(/[?#]/)[0];
    const matches = this.entries().filter((entry) => path === entry.path || path.startsWith(`${entry.path}/`));
    return matches.sort((a, b) => b.path.length - a.path.length)[0]?.path ?? null;
  });
  protected readonly narrow = toSignal(
    inject(BreakpointObserver)
      .observe(NARROW_QUERY)
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );
  protected readonly signingOut = signal(false);

  constructor() {
    const destroyRef = inject(DestroyRef);
    inject(HeadingFocus).start(destroyRef);
    this.router.events
      .pipe(filter((event): event is NavigationEnd => event instanceof NavigationEnd), takeUntilDestroyed(destroyRef))
      .subscribe((event) => this.url.set(event.urlAfterRedirects));
    const stopListening = inject(Location).onUrlChange((url) => this.url.set(url));
    destroyRef.onDestroy(stopListening);
  }

  protected toggleNavigation(): void {
    void this.sidenav().toggle();
  }

  /** In the narrow layout the drawer covers the page, so it closes once a link is chosen. */
  protected closeNavigationIfOver(): void {
    if (this.narrow()) {
      void this.sidenav().close();
    }
  }

  /** The skip link is a same-page jump; handled here so the router never sees a fragment change. */
  protected skipToMain(event: Event): void {
    event.preventDefault();
    this.document.getElementById('main')?.focus();
  }

  protected signOut(): void {
    this.signingOut.set(true);
    this.auth.signOut().subscribe(() => {
      this.signingOut.set(false);
      void this.announcer.announce('You are signed out.', 'polite');
      void this.router.navigate(['/sign-in']);
    });
  }
}
