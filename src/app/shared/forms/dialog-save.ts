import { inject, signal } from '@angular/core';
import { AbstractControl } from '@angular/forms';
import { MatDialogRef } from '@angular/material/dialog';
import { Observable } from 'rxjs';

import { ProblemDetails, toProblem } from '../../core/http/problem-details';
import { showServerFieldErrors } from './server-field-errors';

export interface DialogSaveOptions {
  /** The field a 409 is about (a tag or an address already taken), and the sentence shown on it. */
  conflict?: { control: AbstractControl; message: string };
  /** Body field → control path where the two names differ (see showServerFieldErrors). */
  fieldNames?: Readonly<Record<string, string>>;
  /** Called with a refused save's problem before it shows; may return the problem to show in its place. */
  refused?: (problem: ProblemDetails) => ProblemDetails | void;
}

/**
 * The save of a form in a dialog: an invalid form only shows its errors, one request at a time, the dialog
 * closes with what the server answered; a refusal shows the problem, marks a 409 on the field it is about
 * and puts the server's per-field messages beside their fields (the rest in `otherMessages`).
 * Make it in a field initializer: it injects the dialog it closes.
 */
export class DialogSave<R> {
  private readonly dialogRef = inject<MatDialogRef<unknown, R>>(MatDialogRef);
  private readonly savingNow = signal(false);
  private readonly shownProblem = signal<ProblemDetails | null>(null);
  private readonly leftOver = signal<string[]>([]);

  /** A request is on its way; the save button is off meanwhile. */
  readonly saving = this.savingNow.asReadonly();
  /** Why the last save was refused, or null. */
  readonly problem = this.shownProblem.asReadonly();
  /** The server's field messages that no control of the form took. */
  readonly otherMessages = this.leftOver.asReadonly();

  constructor(
    private readonly form: AbstractControl,
    private readonly options: DialogSaveOptions = {},
  ) {}

  /** Checks the form, then sends `request()` and closes the dialog with its answer. */
  submit(request: () => Observable<R>): void {
    this.form.markAllAsTouched();
    if (this.form.invalid || this.savingNow()) {
      return;
    }
    this.savingNow.set(true);
    this.shownProblem.set(null);
    this.leftOver.set([]);
    request().subscribe({
      next: (answer) => this.dialogRef.close(answer),
      error: (error: unknown) => this.refuse(toProblem(error)),
    });
  }

  private refuse(problem: ProblemDetails): void {
    this.savingNow.set(false);
    this.shownProblem.set(this.options.refused?.(problem) ?? problem);
    const conflict = this.options.conflict;
    if (problem.status === 409 && conflict) {
      conflict.control.setErrors({ ...(conflict.control.errors ?? {}), server: conflict.message });
    }
    this.leftOver.set(showServerFieldErrors(this.form, problem, this.options.fieldNames));
  }
}
