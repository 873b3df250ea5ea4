import { eq } from 'drizzle-orm';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { recordAudit } from '../../server/audit/audit-service';
import { evaluateBalance, validateRunDocument } from '../../server/engine';
import { documentToStorage } from '../../server/runs/run-document-mapper';
import { approvalMeanings, rejectionMeanings, returnMeanings } from '../../server/runs/review-dto';
import { signedHash } from '../../server/runs/signature-hash';
import { insertReadings } from '../../server/runs/readings-bulk';
import type { Tx } from '../client';
import { apparatus, balanceResults, gases, people, projects, runs, signatures, type RunState } from '../schema';

export interface DemoContext {
  byRole: Record<string, typeof people.$inferSelect>;
  projects: (typeof projects.$inferSelect)[];
  today: string;
}

interface DemoRun {
  fixture: string;
  project: 'GX' | 'CB';
  author: 'technician' | 'assistant';
  state: RunState;
  apparatus: 'PC-3' | 'BC-1';
  reason?: string;
}

/** The demo runs: the fixture run documents of fixtures/runs, placed at different points of the workflow. */
const demoRuns: DemoRun[] = [
  { fixture: 'isothermal', project: 'GX', author: 'technician', state: 'approved', apparatus: 'PC-3' },
  { fixture: 'adiabatic', project: 'GX', author: 'technician', state: 'submitted', apparatus: 'PC-3' },
  { fixture: 'polytropic', project: 'GX', author: 'assistant', state: 'submitted', apparatus: 'PC-3' },
  { fixture: 'isobaric', project: 'GX', author: 'technician', state: 'draft', apparatus: 'PC-3' },
  { fixture: 'isochoric', project: 'GX', author: 'assistant', state: 'returned', apparatus: 'PC-3', reason: 'The barometer reading for the start of the run is missing from the notes; add it and resubmit.' },
  { fixture: 'calorimetric', project: 'CB', author: 'technician', state: 'approved', apparatus: 'BC-1' },
  { fixture: 'calorimetric-heat-leak-forgotten', project: 'CB', author: 'assistant', state: 'submitted', apparatus: 'BC-1' },
];

const fixturesDir = join(__dirname, '..', '..', 'fixtures', 'runs');
// Fewer draws than a live check keep the first start quick; live checks use the lab setting.
const SEED_DRAWS = 20_000;

export async function seedDemoRuns(tx: Tx, ctx: DemoContext): Promise<void> {
  const investigator = ctx.byRole['investigator'];
  let counter = 0;
  for (const demo of demoRuns) {
    const parsed = validateRunDocument(JSON.parse(readFileSync(join(fixturesDir, `${demo.fixture}.json`), 'utf8')));
    if (!parsed.ok) throw new Error(`fixture ${demo.fixture} is not a valid run document: ${parsed.errors[0]?.path} ${parsed.errors[0]?.message}`);
    const doc = parsed.doc;
    const { setup, rows } = documentToStorage(doc);
    const project = ctx.projects.find((p) => p.code === demo.project)!;
    const author = ctx.byRole[demo.author];
    const [gas] = doc.gas.model === 'species' ? await tx.select().from(gases).where(eq(gases.code, doc.gas.species)) : [];
    const [app] = await tx.select().from(apparatus).where(eq(apparatus.tag, demo.apparatus));
    const code = `R-${doc.runDate.slice(0, 4)}-${String(++counter).padStart(4, '0')}`;
    const [run] = await tx.insert(runs).values({
      code, projectId: project.id, authorId: author.id, title: doc.title ?? demo.fixture, process: doc.process.claimed, runDate: doc.runDate,
      gasId: gas?.id ?? null, apparatusId: app?.id ?? null, setup: setup as Record<string, unknown>, state: demo.state,
      returnReason: demo.reason ?? null,
    }).returning();
    await insertReadings(tx, run.id, rows);
    await recordAudit(tx, { action: 'seed.run', entityType: 'run', entityId: run.id, after: { code, state: demo.state, fixture: `${demo.fixture}.json` }, reason: 'demo data' });
    if (demo.state === 'draft') continue;

    // The fixture's own apparatus constants are what the result was computed from; the demo keeps them in setup.
    const result = evaluateBalance(doc, { draws: SEED_DRAWS });
    const [stored] = await tx.insert(balanceResults).values({
      runId: run.id, runVersion: run.version, engineVersion: result.engineVersion, inputHash: result.inputHash, verdict: result.verdict,
      en: result.En, residual: result.residual.r, expandedUncertainty: result.residual.U, result: result as unknown as Record<string, unknown>,
    }).returning();
    await tx.update(runs).set({ verdict: result.verdict, submittedAt: new Date() }).where(eq(runs.id, run.id));
    if (demo.state === 'submitted') continue;

    const action = demo.state === 'approved' ? 'approve' : demo.state === 'returned' ? 'return' : 'reject';
    const meaning = { approve: approvalMeanings[0], return: returnMeanings[0], reject: rejectionMeanings[0] }[action];
    await tx.insert(signatures).values({
      runId: run.id, signerId: investigator.id, action, meaning, reason: demo.reason ?? null,
      signedHash: signedHash(run, rows, stored),
    });
    await tx.update(runs).set({ version: run.version + 1, decidedAt: new Date() }).where(eq(runs.id, run.id));
  }
}
