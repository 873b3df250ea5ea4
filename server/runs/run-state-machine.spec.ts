import { roles, runStates, type Role, type RunState } from '../../db/schema';
import { refusal, type RunAction } from './run-state-machine';

const actions: RunAction[] = ['edit', 'submit', 'approve', 'return', 'reject', 'correct'];

/**
 * The expected workflow, written out independently of the implementation: for each action, the
 * states it starts from and who may take it (author = the run's own author; reviewer = an
 * investigator of the project who did not write it).
 */
function expected(action: RunAction, role: Role, isAuthor: boolean, state: RunState): boolean {
  const writer = role === 'technician' || role === 'assistant' || role === 'investigator';
  switch (action) {
    case 'edit':
    case 'submit':
      return writer && isAuthor && (state === 'draft' || state === 'returned');
    case 'approve':
    case 'return':
    case 'reject':
      return role === 'investigator' && !isAuthor && state === 'submitted';
    case 'correct':
      return writer && state === 'approved';
  }
}

describe('run workflow table', () => {
  const cases = actions.flatMap((action) =>
    roles.flatMap((role) => runStates.flatMap((state) => [true, false].map((isAuthor) => ({ action, role, state, isAuthor })))),
  );

  it.each(cases)('$action by $role (author: $isAuthor) on a $state run', ({ action, role, state, isAuthor }) => {
    const result = refusal(action, { role, isAuthor, isMember: true, state, isLatestRevision: true });
    expect(result === null).toBe(expected(action, role, isAuthor, state));
  });

  it('answers 403 for the wrong person and 409 for the wrong state', () => {
    const base = { isMember: true, isLatestRevision: true };
    expect(refusal('approve', { ...base, role: 'technician', isAuthor: false, state: 'submitted' })?.status).toBe(403);
    expect(refusal('approve', { ...base, role: 'investigator', isAuthor: true, state: 'submitted' })?.status).toBe(403);
    expect(refusal('approve', { ...base, role: 'investigator', isAuthor: false, state: 'draft' })?.status).toBe(409);
    expect(refusal('edit', { ...base, role: 'technician', isAuthor: true, state: 'approved' })?.status).toBe(409);
  });

  it('lets nobody act on an older revision', () => {
    for (const action of actions) {
      const r = refusal(action, { role: 'investigator', isAuthor: false, isMember: true, state: 'submitted', isLatestRevision: false });
      expect(r?.status).toBe(409);
    }
  });

  it('keeps investigators to the runs of their own projects', () => {
    const r = refusal('approve', { role: 'investigator', isAuthor: false, isMember: false, state: 'submitted', isLatestRevision: true });
    expect(r).toEqual({ status: 403, reason: 'You review only the runs of your own projects.' });
  });
});
