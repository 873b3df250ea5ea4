import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { RouterLink } from '@angular/router';
import { auditActionLabel, REVIEW_DECISION_LABELS, VERDICT_LABELS } from '@contract';

import { RUN_STATE_LABELS } from '../runs.models';
import { HistoryEvent, RunRevision, RunSignature } from '../run-detail.models';

const VERDICT_WORDS: Readonly<Record<string, string>> = VERDICT_LABELS;

const SIGNATURE_LABELS: Readonly<Record<string, string>> = REVIEW_DECISION_LABELS;

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
    // The audit trail's words for the action (the contract's table), so both screens read alike.
    const action = auditActionLabel(event.action);
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
