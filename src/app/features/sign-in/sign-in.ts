import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router } from '@angular/router';
import { catchError, map, of } from 'rxjs';

import { Auth } from '../../core/auth/auth';
import { ProblemDetails } from '../../core/http/problem-details';
import { ProblemBanner } from '../../shared/problem-banner/problem-banner';

/** Only paths inside Qwell; anything else (another host, `//host`) goes home. */
export function safeReturnUrl(url: string | undefined): string {
  return url && url.startsWith('/') && !url.startsWith('//') && !url.startsWith('/sign-in')
    ? url
    : '/home';
}

@Component({
  selector: 'qw-sign-in',
  imports: [
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    ProblemBanner,
    ReactiveFormsModule,
  ],
  templateUrl: './sign-in.html',
  styleUrl: './sign-in.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SignIn {
  private readonly auth = inject(Auth);
  private readonly router = inject(Router);

  /** From the query string (`?returnUrl=`), set by the guards. */
  readonly returnUrl = input<string>();

  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    password: ['', Validators.required],
  });
  protected readonly busy = signal(false);
  protected readonly problem = signal<ProblemDetails | null>(null);
  protected readonly passwordShown = signal(false);
  /** The README's demo sign-ins are mentioned only while the invented demo lab is loaded. */
  protected readonly demoLab = toSignal(
    inject(HttpClient).get<{ demoLab?: boolean }>('/api/health').pipe(
      map((health) => health.demoLab === true),
      catchError(() => of(false)),
    ),
    { initialValue: false },
  );

  protected togglePasswordShown(): void {
    this.passwordShown.update((shown) => !shown);
  }

  protected signIn(): void {
    if (this.busy()) {
      return;
    }
    // Addresses pasted from mail often carry a space at either end.
    const email = this.form.controls.email.value.trim();
    this.form.controls.email.setValue(email);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.problem.set(null);
    this.auth.signIn(email, this.form.controls.password.value).subscribe({
      next: () => {
        this.busy.set(false);
        void this.router.navigateByUrl(safeReturnUrl(this.returnUrl()));
      },
      error: (problem: ProblemDetails) => {
        this.busy.set(false);
        // The password stays, so a typo is fixed in place; an emptied field would show as an error.
        this.problem.set(problem);
      },
    });
  }
}
