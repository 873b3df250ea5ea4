import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { RouterLink } from '@angular/router';

import { RUN_STATE_LABELS } from '../runs.models';
import { HistoryEvent, RunRevision, RunSignature } from '../run-detail.models';

/** Audit actions in words people use. */
const ACTION_LABELS: Readonly<Record<string, string>> = {
  'run.create': 'Created the run',
  'run.update': 'Edited the run',
  'run.readings-replace': 'Replaced the readings',
  'run.submit': 'Submitted for review',
  'run.checked': 'Balance checked',
  'run.check-failed': 'Balance check failed',
  'run.approve': 'Approved (signed)',
  'run.return': 'Returned for correction (signed)',
  'run.reject': 'Rejected (signed)',
  'run.revise': 'Opened a corrected revision',
  'run.export': 'Downloaded the run document',
  'signature.refused': 'Signature refused',
  'seed.run': 'Loaded with the demo lab',
};

const SIGNATURE_LABELS: Readonly<Record<string, string>> = {
  approve: 'Approved',
  return: 'Returned for correction',
  reject: 'Rejected',
};

/** Signatures, revisions and the run's audit events. */
@Component({
  selector: 'qw-run-history',
  imports: [DatePipe, RouterLink],
  templateUrl: './run-history.html',
  styleUrl: './run-history.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RunHistory {
  readonly runId = input.required<number>();
  readonly events = input.required<readonly HistoryEvent[]>();
  readonly revisions = input.required<readonly RunRevision[]>();
  readonly signatures = input.required<readonly RunSignature[]>();

  protected readonly stateLabels = RUN_STATE_LABELS;

  protected actionLabel(action: string): string {
    return ACTION_LABELS[action] ?? action;
  }

  protected signatureLabel(action: string): string {
    return SIGNATURE_LABELS[action] ?? action;
  }

  /** The state change an event made, when it records one. */
  protected change(event: HistoryEvent): string | null {
    const before = event.before?.['state'];
    const after = event.after?.['state'];
    if (typeof after !== 'string') {
      return null;
    }
    const label = (state: unknown) => this.stateLabels[state as keyof typeof RUN_STATE_LABELS] ?? String(state);
    return typeof before === 'string' ? `${label(before)} → ${label(after)}` : label(after);
  }
}
