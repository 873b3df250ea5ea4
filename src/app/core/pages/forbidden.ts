import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

import { Auth } from '../auth/auth';
import { ROLE_LABELS } from '../auth/auth.models';

/** Shown by roleGuard in place of a page the person's role doesn't open. */
@Component({
  selector: 'qw-forbidden',
  imports: [MatButtonModule, RouterLink],
  templateUrl: './forbidden.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class Forbidden {
  private readonly auth = inject(Auth);
  protected readonly roleLabel = computed(() => {
    const role = this.auth.role();
    if (!role) {
      return 'your role';
    }
    const label = ROLE_LABELS[role].toLowerCase();
    return `${/^[aeiou]/.test(label) ? 'an' : 'a'} ${label}`;
  });
}
