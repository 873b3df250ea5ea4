import { inRoleGroup, REVIEWERS, RUN_AUTHORS, type Role } from '../../contract/roles';
import { EDITABLE_STATES, REVIEW_ACTIONS, RUN_ACTIONS, type RunAction, type RunState } from '../../contract/runs';

export type { RunAction };

/** What the rules need to know about the person and the run. */
export interface ActionContext {
  role: Role;
  isAuthor: boolean;
  /** Member of the run's project. */
  isMember: boolean;
  state: RunState;
  /** The run's latest revision (older revisions are read-only history). */
  isLatestRevision: boolean;
}

/** The state a run moves to; absent for actions that keep the state. */
export const nextState: Partial<Record<RunAction, RunState>> = {
  submit: 'submitted',
  approve: 'approved',
  return: 'returned',
  reject: 'rejected',
};

const editable = (state: RunState) => (EDITABLE_STATES as readonly RunState[]).includes(state);

/**
 * The one table of the run workflow: null when allowed, otherwise the reason it is refused. The
 * reason distinguishes "not your role" (403) from "not in this state" (409).
 */
export function refusal(action: RunAction, c: ActionContext): { status: 403 | 409; reason: string } | null {
  const forbid = (reason: string) => ({ status: 403 as const, reason });
  const wrongState = (reason: string) => ({ status: 409 as const, reason });
  if (!c.isLatestRevision) return wrongState('This is an older revision; open the latest revision of the run.');
  switch (action) {
    case 'edit':
    case 'submit':
      if (!inRoleGroup(RUN_AUTHORS, c.role) || !c.isAuthor) return forbid('Only the run\'s author may change or submit it.');
      if (!editable(c.state)) return wrongState(`The run is ${c.state}; only draft or returned runs can be changed or submitted.`);
      return null;
    case 'approve':
    case 'return':
    case 'reject':
      if (!inRoleGroup(REVIEWERS, c.role)) return forbid('Only principal investigators sign runs off.');
      if (!c.isMember) return forbid('You review only the runs of your own projects.');
      // Segregation of duties: nobody signs off their own run.
      if (c.isAuthor) return forbid('You cannot review a run you wrote; another investigator of the project must.');
      if (c.state !== 'submitted') return wrongState(`The run is ${c.state}; only submitted runs can be reviewed.`);
      return null;
    case 'correct':
      if (!inRoleGroup(RUN_AUTHORS, c.role) || !c.isMember) return forbid('Only members of the run\'s project who write runs may correct it.');
      if (c.state !== 'approved') return wrongState(`The run is ${c.state}; only approved runs are corrected by a new revision (edit the run itself otherwise).`);
      return null;
  }
}

/** What the run read says a person may do now, and why a reviewer is not offered the review yet. */
export interface OfferedActions {
  actions: RunAction[];
  reviewNote: string | null;
}

/**
 * The actions the run page offers: those the table allows, except that the review decisions wait
 * for the balance result of the run's current version, because a signature names the run and the
 * result the reviewer had on screen (approval is refused without it anyway).
 */
export function offeredActions(c: ActionContext, resultCurrent: boolean): OfferedActions {
  const allowed = RUN_ACTIONS.filter((action) => refusal(action, c) === null);
  const reviewable = allowed.some((action) => (REVIEW_ACTIONS as readonly RunAction[]).includes(action));
  const actions = reviewable && !resultCurrent ? allowed.filter((action) => !(REVIEW_ACTIONS as readonly RunAction[]).includes(action)) : allowed;
  return { actions, reviewNote: reviewNote(c, reviewable, resultCurrent) };
}

/** Said to an investigator of the project on a submitted run they cannot review yet; null otherwise. */
function reviewNote(c: ActionContext, reviewable: boolean, resultCurrent: boolean): string | null {
  if (!inRoleGroup(REVIEWERS, c.role) || !c.isMember || c.state !== 'submitted' || !c.isLatestRevision) return null;
  if (c.isAuthor) return 'You wrote this run, so another investigator of the project reviews it.';
  return reviewable && !resultCurrent ? 'The review opens once the balance check has stored its result for this version of the run.' : null;
}
