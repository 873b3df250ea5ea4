import { eq, inArray } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { apparatus, gases, instruments, people, projects, runs, signatures } from '../../db/schema';
import { auditActionLabel } from '../../contract/audit';
import { fieldChanges, recordTypeLabel, type ReadableEvent, type ReferenceNames } from './audit-readable';

/** The stored fields of an event that reading it needs. */
export interface EventFields {
  actorId: number | null;
  action: string;
  entityType: string;
  entityId: string | null;
  before: unknown;
  after: unknown;
}

const ids = (values: (string | number | null | undefined)[]) =>
  [...new Set(values.map(Number).filter((n) => Number.isInteger(n) && n > 0))];

/** Looks up, in one query per kind, the names of the people and the codes of the records the events touch. */
export async function readableEvents<T extends EventFields>(db: DbOrTx, events: readonly T[]): Promise<(T & ReadableEvent)[]> {
  const of = (type: string) => events.filter((e) => e.entityType === type).map((e) => e.entityId);
  const signatureIds = ids(of('signature'));
  const signatureRuns = signatureIds.length
    ? await db.select({ id: signatures.id, runId: signatures.runId }).from(signatures).where(inArray(signatures.id, signatureIds))
    : [];
  const personIds = ids([...events.map((e) => e.actorId), ...of('person')]);
  const runIds = ids([...of('run'), ...signatureRuns.map((s) => s.runId)]);
  const [peopleRows, runRows, instrumentRows, apparatusRows, projectRows] = await Promise.all([
    personIds.length ? db.select({ id: people.id, name: people.name }).from(people).where(inArray(people.id, personIds)) : [],
    runIds.length ? db.select({ id: runs.id, code: runs.code, revision: runs.revision }).from(runs).where(inArray(runs.id, runIds)) : [],
    ids(of('instrument')).length ? db.select({ id: instruments.id, code: instruments.tag }).from(instruments).where(inArray(instruments.id, ids(of('instrument')))) : [],
    ids(of('apparatus')).length ? db.select({ id: apparatus.id, code: apparatus.tag }).from(apparatus).where(inArray(apparatus.id, ids(of('apparatus')))) : [],
    ids(of('project')).length ? db.select({ id: projects.id, code: projects.code }).from(projects).where(inArray(projects.id, ids(of('project')))) : [],
  ]);
  const names = new Map(peopleRows.map((p) => [p.id, p.name]));
  const runCodes = new Map(runRows.map((r) => [r.id, `${r.code} rev. ${r.revision}`]));
  const codes: Record<string, Map<number, string>> = {
    run: runCodes,
    instrument: new Map(instrumentRows.map((r) => [r.id, r.code])),
    apparatus: new Map(apparatusRows.map((r) => [r.id, r.code])),
    project: new Map(projectRows.map((r) => [r.id, r.code])),
    person: names,
    signature: new Map(signatureRuns.map((s) => [s.id, `on run ${runCodes.get(s.runId) ?? s.runId}`])),
  };
  const refs = await referenceNames(db, events);
  return events.map((e) => {
    const id = Number(e.entityId);
    const record = (Number.isInteger(id) ? codes[e.entityType]?.get(id) : undefined) ?? (e.entityId ? `#${e.entityId}` : '');
    return {
      ...e,
      actorName: e.actorId === null ? null : names.get(e.actorId) ?? null,
      actionLabel: auditActionLabel(e.action),
      recordType: recordTypeLabel(e.entityType),
      record,
      changes: fieldChanges(e.before, e.after, refs),
    };
  });
}

/** All revisions of a run code ("R-2026-0007"), for the trail's run filter; empty when none. */
export async function runIdsForCode(db: DbOrTx, code: string): Promise<number[]> {
  const rows = await db.select({ id: runs.id }).from(runs).where(eq(runs.code, code.trim().toUpperCase()));
  return rows.map((r) => r.id);
}

/** Ids that a before/after names: the gas, apparatus and project, each channel's instrument, and people (author, signer, members). */
function referencedIds(events: readonly EventFields[]) {
  const found = { gasId: [] as unknown[], apparatusId: [] as unknown[], projectId: [] as unknown[], instrumentId: [] as unknown[], personId: [] as unknown[] };
  for (const e of events) {
    for (const side of [e.before, e.after]) {
      if (!side || typeof side !== 'object') continue;
      const s = side as Record<string, unknown>;
      found.gasId.push(s['gasId']);
      found.apparatusId.push(s['apparatusId']);
      found.projectId.push(s['projectId']);
      found.personId.push(s['authorId'], s['signerId'], ...(Array.isArray(s['members']) ? s['members'] : []));
      const channels = (s['setup'] as { channels?: Record<string, { instrumentId?: unknown }> } | undefined)?.channels;
      if (channels && typeof channels === 'object') for (const ch of Object.values(channels)) found.instrumentId.push(ch?.instrumentId);
    }
  }
  return found;
}

/** The codes a changed id field shows instead of its number, one query per kind that occurs. */
async function referenceNames(db: DbOrTx, events: readonly EventFields[]): Promise<ReferenceNames> {
  const found = referencedIds(events);
  const gasIds = ids(found.gasId as (number | null)[]);
  const apparatusIds = ids(found.apparatusId as (number | null)[]);
  const projectIds = ids(found.projectId as (number | null)[]);
  const instrumentIds = ids(found.instrumentId as (number | null)[]);
  const personIds = ids(found.personId as (number | null)[]);
  const [gasRows, apparatusRows, projectRows, instrumentRows, personRows] = await Promise.all([
    gasIds.length ? db.select({ id: gases.id, code: gases.code }).from(gases).where(inArray(gases.id, gasIds)) : [],
    apparatusIds.length ? db.select({ id: apparatus.id, code: apparatus.tag }).from(apparatus).where(inArray(apparatus.id, apparatusIds)) : [],
    projectIds.length ? db.select({ id: projects.id, code: projects.code }).from(projects).where(inArray(projects.id, projectIds)) : [],
    instrumentIds.length ? db.select({ id: instruments.id, code: instruments.tag }).from(instruments).where(inArray(instruments.id, instrumentIds)) : [],
    personIds.length ? db.select({ id: people.id, code: people.name }).from(people).where(inArray(people.id, personIds)) : [],
  ]);
  const map = (rows: { id: number; code: string }[]) => new Map(rows.map((r) => [r.id, r.code]));
  const names = map(personRows);
  return { gasId: map(gasRows), apparatusId: map(apparatusRows), projectId: map(projectRows), instrumentId: map(instrumentRows), authorId: names, signerId: names, members: names };
}
