import { and, asc, eq } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { apparatus, balanceResults, gases, people, projects, signatures } from '../../db/schema';
import type { Config } from '../config';
import type { SessionPerson } from '../core/session';
import { validateRunDocument, type BalanceResult } from '../engine';
import { buildSeries } from '../engine/series';
import { loadVisibleRun, type RunRow } from '../runs/run-access';
import { loadRunDocument } from '../runs/run-loader';
import { runHistory } from '../runs/run-history';

export interface RunReportData {
  run: RunRow;
  lab: string;
  authorName: string;
  project: string;
  gas: string;
  apparatus: string;
  /** Pa, the vessel's rated pressure when the register has it. */
  ratedPressure: number | null;
  /** Whether the rating is absolute or gauge (above the barometric pressure). */
  ratedPressureReference: 'absolute' | 'gauge';
  result: { id: number; runVersion: number; computedAt: Date; stale: boolean; value: BalanceResult } | null;
  /** SI P (Pa) and V (m³) from the engine, when the run has a pressure–volume path. */
  pv: { P: Float64Array; V: Float64Array } | null;
  /** Why there is no diagram, when there is none. */
  pvNote: string | null;
  signatures: { signerName: string; action: string; meaning: string; reason: string | null; signedAt: Date; signedHash: string }[];
  history: Awaited<ReturnType<typeof runHistory>>['items'];
}

/** Everything the run report prints, read for a person who may see the run (404/403 otherwise). */
export async function loadRunReport(db: Database, config: Config, person: SessionPerson, id: number): Promise<RunReportData> {
  const run = await loadVisibleRun(db, person, id);
  const [[author], [project], [gas], [app], [result], sigs, { items: history }] = await Promise.all([
    db.select({ name: people.name }).from(people).where(eq(people.id, run.authorId)),
    db.select({ code: projects.code, name: projects.name }).from(projects).where(eq(projects.id, run.projectId)),
    run.gasId ? db.select({ code: gases.code, name: gases.name }).from(gases).where(eq(gases.id, run.gasId)) : Promise.resolve([]),
    run.apparatusId ? db.select().from(apparatus).where(eq(apparatus.id, run.apparatusId)) : Promise.resolve([]),
    db.select().from(balanceResults).where(and(eq(balanceResults.runId, id), eq(balanceResults.current, true))),
    db.select({ signerName: people.name, action: signatures.action, meaning: signatures.meaning, reason: signatures.reason, signedAt: signatures.signedAt, signedHash: signatures.signedHash })
      .from(signatures).innerJoin(people, eq(people.id, signatures.signerId)).where(eq(signatures.runId, id)).orderBy(asc(signatures.signedAt)),
    runHistory(db, person, id),
  ]);

  let pv: RunReportData['pv'] = null;
  let pvNote: string | null = null;
  const doc = validateRunDocument(await loadRunDocument(db, run, config.labName));
  if (!doc.ok) pvNote = `The run is not complete enough to draw (${doc.errors.length} problem(s) in its data).`;
  else {
    try {
      const s = buildSeries(doc.doc);
      if (s.P && s.V && s.N >= 2) pv = { P: s.P.si, V: s.V.si };
      else pvNote = 'This run has no pressure–volume path (no pressure or no volume channel), so there is no P–V diagram.';
    } catch (e) {
      pvNote = `The readings cannot be drawn: ${(e as Error).message}.`;
    }
  }
  const appRow = app as (typeof apparatus.$inferSelect) | undefined;
  return {
    run, lab: config.labName, authorName: author?.name ?? '', project: project ? `${project.code} ${project.name}` : '',
    gas: gas ? `${gas.name} (${gas.code})` : run.process === 'calorimetric' ? 'calorimeter contents' : 'not set',
    apparatus: appRow ? `${appRow.tag} ${appRow.name}` : 'not set',
    ratedPressure: appRow?.ratedPressure ?? null,
    ratedPressureReference: appRow?.ratedPressureReference ?? 'absolute',
    result: result ? { id: result.id, runVersion: result.runVersion, computedAt: result.computedAt, stale: result.computedAt < run.editedAt, value: result.result as unknown as BalanceResult } : null,
    pv, pvNote, signatures: sigs, history,
  };
}
