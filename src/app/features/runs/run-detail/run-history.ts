import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { RouterLink } from '@angular/router';
import { VERDICT_LABELS } from '@contract';

import { RUN_STATE_LABELS } from '../runs.models';
import { HistoryEvent, RunRevision, RunSignature } from '../run-detail.models';

/** Audit actions in words people use. */
const ACTION_LABELS: Readonly<Record<string, string>> = {
  'run.create': 'Created the run',
  'run.update': 'Edited the run',
  'run.readings-replace': 'Replaced the readings',
  'run.submit': 'Submitted the run for review',
  'run.checked': 'Checked the energy balance',
  'run.check-failed': 'Could not check the energy balance',
  'run.approve': 'Approved the run with a signature',
  'run.return': 'Returned the run for correction with a signature',
  'run.reject': 'Rejected the run with a signature',
  'run.revise': 'Opened a corrected revision',
  'run.export': 'Downloaded the run document',
  'run.report': 'Printed the run report',
  'signature.refused': 'A signature was refused',
  'seed.run': 'Loaded the run with the demo lab',
};

const VERDICT_WORDS: Readonly<Record<string, string>> = VERDICT_LABELS;

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

  /** The event as a sentence: "Created the run (Draft)", "Checked the energy balance (Breaks)". */
  protected sentence(event: HistoryEvent): string {
    const action = ACTION_LABELS[event.action] ?? event.action.replace(/^\w+\./, '').replace(/-/g, ' ');
    const verdict = event.action === 'run.checked' ? VERDICT_WORDS[String(event.after?.['verdict'])] : undefined;
    const detail = verdict ?? this.change(event);
    return detail ? `${action} (${detail})` : action;
  }

  protected who(event: HistoryEvent): string {
    // Checks and the sweep run with no one signed in: the server did them.
    return event.actorName ?? event.actorEmail ?? 'Qwell';
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
