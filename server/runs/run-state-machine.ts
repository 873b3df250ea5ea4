import type { Role, RunState } from '../../db/schema';

/** Everything a person can do to a run; each is a route. */
export type RunAction = 'edit' | 'replaceReadings' | 'submit' | 'approve' | 'return' | 'reject' | 'revise';

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

const AUTHORS: readonly Role[] = ['technician', 'assistant', 'investigator'];
const editable: readonly RunState[] = ['draft', 'returned'];

/** The state a run moves to; absent for actions that keep the state. */
export const nextState: Partial<Record<RunAction, RunState>> = {
  submit: 'submitted',
  approve: 'approved',
  return: 'returned',
  reject: 'rejected',
};

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
    case 'replaceReadings':
    case 'submit':
      if (!AUTHORS.includes(c.role) || !c.isAuthor) return forbid('Only the run\'s author may change or submit it.');
      if (!editable.includes(c.state)) return wrongState(`The run is ${c.state}; only draft or returned runs can be changed or submitted.`);
      return null;
    case 'approve':
    case 'return':
    case 'reject':
      if (c.role !== 'investigator') return forbid('Only principal investigators sign runs off.');
      if (!c.isMember) return forbid('You review only the runs of your own projects.');
      // Segregation of duties: nobody signs off their own run.
      if (c.isAuthor) return forbid('You cannot review a run you wrote; another investigator of the project must.');
      if (c.state !== 'submitted') return wrongState(`The run is ${c.state}; only submitted runs can be reviewed.`);
      return null;
    case 'revise':
      if (!AUTHORS.includes(c.role) || !c.isMember) return forbid('Only members of the run\'s project who write runs may correct it.');
      if (c.state !== 'approved') return wrongState(`The run is ${c.state}; only approved runs are corrected by a new revision (edit the run itself otherwise).`);
      return null;
  }
}
