import { and, eq, max } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { projectMembers, runs } from '../../db/schema';
import { forbidden, HttpProblem, notFound } from '../core/problem';
import type { SessionPerson } from '../core/session';
import { refusal, type ActionContext, type RunAction } from './run-state-machine';

export type RunRow = typeof runs.$inferSelect;

/** Projects whose runs a person may see; null means every project (quality officers). */
export async function visibleProjectIds(db: DbOrTx, person: SessionPerson): Promise<number[] | null> {
  if (person.role === 'quality') return null;
  const rows = await db.select({ id: projectMembers.projectId }).from(projectMembers).where(eq(projectMembers.personId, person.id));
  return rows.map((r) => r.id);
}

async function isMember(db: DbOrTx, projectId: number, personId: number): Promise<boolean> {
  const [row] = await db.select({ p: projectMembers.projectId }).from(projectMembers)
    .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.personId, personId)));
  return row !== undefined;
}

async function isLatest(db: DbOrTx, run: RunRow): Promise<boolean> {
  const [{ latest }] = await db.select({ latest: max(runs.revision) }).from(runs).where(eq(runs.code, run.code));
  return latest === run.revision;
}

/** Loads a run the person may see (404 when it does not exist, 403 when it is not theirs to see). */
export async function loadVisibleRun(db: DbOrTx, person: SessionPerson, id: number, opts: { lock?: boolean } = {}): Promise<RunRow> {
  const query = db.select().from(runs).where(eq(runs.id, id));
  const [run] = opts.lock ? await query.for('update') : await query;
  if (!run) throw notFound(`There is no run with id ${id}.`);
  if (person.role === 'admin') throw forbidden('Administrators manage people and projects; runs are for the lab\'s members.');
  if (person.role !== 'quality' && !(await isMember(db, run.projectId, person.id))) {
    throw forbidden(`Run ${run.code} belongs to a project you are not a member of.`);
  }
  return run;
}

/** What the workflow table needs to know about a person and a run they can see (loadVisibleRun). */
export async function actionContext(db: DbOrTx, person: SessionPerson, run: RunRow): Promise<ActionContext> {
  return {
    role: person.role,
    isAuthor: run.authorId === person.id,
    // loadVisibleRun let everyone but quality officers in only as members of the run's project.
    isMember: person.role !== 'quality',
    state: run.state,
    isLatestRevision: await isLatest(db, run),
  };
}

/** Loads and locks a run for an action, checks the workflow table and the version the client read. */
export async function loadRunFor(db: DbOrTx, person: SessionPerson, id: number, action: RunAction, version?: number): Promise<RunRow> {
  const run = await loadVisibleRun(db, person, id, { lock: true });
  const refused = refusal(action, await actionContext(db, person, run));
  if (refused) throw new HttpProblem(refused.status, refused.status === 403 ? 'Not allowed' : 'Conflict', refused.reason);
  if (version !== undefined && version !== run.version) {
    throw new HttpProblem(409, 'Conflict',
      `Run ${run.code} was changed by someone else since you opened it (you have version ${version}, the server has ${run.version}). Reload the run, check the changes and make your edit again.`,
      undefined, { currentVersion: run.version });
  }
  return run;
}
