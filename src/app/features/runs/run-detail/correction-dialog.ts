import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { TEXT_LIMITS } from '@contract';
import { map } from 'rxjs';

import { DialogSave } from '../../../shared/forms/dialog-save';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { RunsApi } from '../runs-api';

/** Asks why an approved run is corrected, then opens the new draft revision; closes with its id. */
@Component({
  selector: 'qw-correction-dialog',
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, ProblemBanner, ReactiveFormsModule],
  template: `
    <h2 mat-dialog-title>Correct {{ data.code }}</h2>
    <form [formGroup]="form" (ngSubmit)="open()" novalidate>
      <mat-dialog-content>
        <p>
          The approved revision stays as it is and readable. A new draft revision is made from it for you to correct
          and submit again.
        </p>
        <mat-form-field appearance="outline">
          <mat-label>Why this run needs a correction</mat-label>
          <textarea matInput formControlName="reason" rows="3" required></textarea>
          <mat-hint>At least 5 characters; kept in the run's history.</mat-hint>
          <mat-hint align="end">{{ form.controls.reason.value.length }} / {{ maxReason }}</mat-hint>
          @if (form.controls.reason.hasError('maxlength')) {
            <mat-error>At most {{ maxReason }} characters; shorten it by {{ form.controls.reason.value.length - maxReason }}.</mat-error>
          } @else if (form.controls.reason.invalid) {
            <mat-error>Write at least 5 characters saying what is corrected and why.</mat-error>
          }
        </mat-form-field>
        <qw-problem-banner [problem]="save.problem()" [messages]="save.otherMessages()" />
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="save.saving()">Start the correction</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `mat-form-field { width: 100%; } mat-dialog-content { max-width: 32rem; }`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CorrectionDialog {
  private readonly api = inject(RunsApi);
  protected readonly data = inject<{ runId: number; code: string }>(MAT_DIALOG_DATA);

  /** The server's limit for a correction's reason (contract/text-limits.ts). */
  protected readonly maxReason = TEXT_LIMITS.reason;
  protected readonly form = inject(NonNullableFormBuilder).group({
    reason: ['', [Validators.required, Validators.maxLength(TEXT_LIMITS.reason), (control: { value: string }) => (control.value.trim().length >= 5 ? null : { short: true })]],
  });
  protected readonly save = new DialogSave<number>(this.form);

  protected open(): void {
    this.save.submit(() => this.api.revise(this.data.runId, this.form.getRawValue().reason.trim()).pipe(map((revision) => revision.id)));
  }
}
