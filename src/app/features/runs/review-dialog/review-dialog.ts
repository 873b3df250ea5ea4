import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MIN_JUSTIFICATION, MIN_REVIEW_REASON, SIGNATURE_MEANINGS, TEXT_LIMITS } from '@contract';

import { map } from 'rxjs';

import { ProblemDetails } from '../../../core/http/problem-details';
import { DialogSave } from '../../../shared/forms/dialog-save';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { WithUncertaintyPipe } from '../../../shared/value-with-uncertainty/value-with-uncertainty-pipe';
import { VerdictDisplay } from '../../../shared/verdict-display/verdict-display';
import { RunsApi } from '../runs-api';
import { BalanceResult, ReviewAction, SignatureRequest } from '../run-detail.models';

/** What the dialog signs. */
export interface ReviewDialogData {
  runId: number;
  code: string;
  title: string;
  /** The version the reviewer read; the server refuses the signature if the run changed since. */
  version: number;
  action: ReviewAction;
  result: BalanceResult;
}

const ACTION_WORDS: Readonly<Record<ReviewAction, { title: string; button: string }>> = {
  approve: { title: 'Approve', button: 'Sign and approve' },
  return: { title: 'Return for correction', button: 'Sign and return' },
  reject: { title: 'Reject', button: 'Sign and reject' },
};

/** The electronic signature of a review decision: the verdict up front, then password, meaning and reason. */
@Component({
  selector: 'qw-review-dialog',
  imports: [
    DecimalPipe,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    ProblemBanner,
    ReactiveFormsModule,
    VerdictDisplay,
    WithUncertaintyPipe,
  ],
  templateUrl: './review-dialog.html',
  styleUrl: './review-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReviewDialog {
  private readonly api = inject(RunsApi);
  protected readonly data = inject<ReviewDialogData>(MAT_DIALOG_DATA);

  protected readonly words = ACTION_WORDS[this.data.action];
  /** Exactly the meanings the server accepts for this decision (the contract's list). */
  protected readonly meanings = SIGNATURE_MEANINGS[this.data.action];
  /** Approving a balance that breaks, or a check that cannot tell, is allowed only with a written justification. */
  protected readonly needsJustification =
    this.data.action === 'approve' && (this.data.result.verdict === 'breaks' || this.data.result.verdict === 'indeterminate');
  protected readonly minReason =
    this.needsJustification ? MIN_JUSTIFICATION : this.data.action === 'approve' ? 0 : MIN_REVIEW_REASON;
  /** The server's limit for the reason signed with a decision (contract/text-limits.ts). */
  protected readonly maxReason = TEXT_LIMITS.signatureReason;
  protected readonly reasonLabel = this.needsJustification
    ? 'Justification'
    : this.data.action === 'approve'
      ? 'Comment (optional)'
      : 'Reason';

  protected readonly form = inject(NonNullableFormBuilder).group({
    password: ['', Validators.required],
    meaning: [this.meanings.length === 1 ? this.meanings[0] : '', Validators.required],
    reason: ['', this.minReason > 0 ? [Validators.required, minTrimmed(this.minReason), Validators.maxLength(this.maxReason)] : [Validators.maxLength(this.maxReason)]],
  });

  /** Closes with the decision once signed; a refusal stays open with the server's words. */
  protected readonly save = new DialogSave<ReviewAction>(this.form, { refused: (problem) => this.refused(problem) });

  protected sign(): void {
    const { password, meaning, reason } = this.form.getRawValue();
    const body: SignatureRequest = { version: this.data.version, password, meaning };
    if (reason.trim()) {
      body.reason = reason.trim();
    }
    this.save.submit(() => this.api.review(this.data.runId, this.data.action, body).pipe(map(() => this.data.action)));
  }

  private refused(problem: ProblemDetails): ProblemDetails {
    // A refused password is never kept in the form: wrong (401), or the attempt that locked the account (423).
    if (problem.status === 401 || problem.status === 423) {
      this.form.controls.password.reset('');
    }
    return problem.status === 409
      ? { ...problem, detail: `${problem.detail} Close this dialog and reload the run before you sign.` }
      : problem;
  }
}

function minTrimmed(min: number) {
  return (control: { value: string }) =>
    control.value.trim().length >= min ? null : { minTrimmed: { min, actual: control.value.trim().length } };
}
