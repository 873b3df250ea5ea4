import { eq } from 'drizzle-orm';
import { balanceResults, projects, runs } from '../../db/schema';
import type { RunState } from '../../contract/runs';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';

// GET /api/runs/:id lists the actions the signed-in person may take, from the server's workflow table
// (run-state-machine.ts); the client shows exactly these. States are set in the database directly so each
// case is read on its own, without waiting for the balance worker.
let h: ApiHarness;
let projectId: number;
let technician: ApiClient;
let assistant: ApiClient;
let investigator: ApiClient;
let quality: ApiClient;

beforeAll(async () => {
  h = await startHarness();
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
  [technician, assistant, investigator, quality] = await Promise.all(
    (['technician', 'assistant', 'investigator', 'quality'] as const).map((role) => clientAs(h.app, role)),
  );
});
afterAll(() => h.close());

async function draftBy(author: ApiClient): Promise<{ id: number; version: number }> {
  const created = await author.post('/api/runs', { projectId, title: 'Actions spec run', process: 'isothermal', runDate: '2026-05-04' });
  expect(created.status).toBe(201);
  return { id: created.body.id, version: created.body.version };
}

const setState = (id: number, state: RunState) => h.handle.db.update(runs).set({ state }).where(eq(runs.id, id));

async function offered(client: ApiClient, id: number): Promise<{ actions: string[]; reviewNote: string | null }> {
  const res = await client.get(`/api/runs/${id}`);
  expect(res.status).toBe(200);
  return { actions: res.body.actions, reviewNote: res.body.reviewNote };
}

describe('GET /api/runs/:id actions', () => {
  it('offers edit and submit of a draft to its author alone', async () => {
    const run = await draftBy(technician);
    expect(await offered(technician, run.id)).toEqual({ actions: ['edit', 'submit'], reviewNote: null });
    expect(await offered(assistant, run.id)).toEqual({ actions: [], reviewNote: null });
    expect(await offered(investigator, run.id)).toEqual({ actions: [], reviewNote: null });
    expect(await offered(quality, run.id)).toEqual({ actions: [], reviewNote: null });

    await setState(run.id, 'returned');
    expect((await offered(technician, run.id)).actions).toEqual(['edit', 'submit']);
  });

  it('offers the review of a submitted run to an investigator of the project once its result is stored', async () => {
    const run = await draftBy(technician);
    await setState(run.id, 'submitted');
    expect(await offered(investigator, run.id)).toEqual({
      actions: [],
      reviewNote: 'The review opens once the balance check has stored its result for this version of the run.',
    });
    expect(await offered(technician, run.id)).toEqual({ actions: [], reviewNote: null });

    await h.handle.db.insert(balanceResults).values({
      runId: run.id, runVersion: run.version, engineVersion: 'spec', inputHash: 'spec', verdict: 'closes', en: 0.1, residual: 0, expandedUncertainty: 1, result: {},
    });
    expect(await offered(investigator, run.id)).toEqual({ actions: ['approve', 'return', 'reject'], reviewNote: null });
    expect(await offered(assistant, run.id)).toEqual({ actions: [], reviewNote: null });
    expect(await offered(quality, run.id)).toEqual({ actions: [], reviewNote: null });
  });

  it('never offers an investigator the review of their own run, and says why', async () => {
    const run = await draftBy(investigator);
    await setState(run.id, 'submitted');
    expect(await offered(investigator, run.id)).toEqual({
      actions: [],
      reviewNote: 'You wrote this run, so another investigator of the project reviews it.',
    });
  });

  it('offers the correction of an approved run to the project members who write runs, and nothing on the older revision', async () => {
    const run = await draftBy(technician);
    await setState(run.id, 'approved');
    for (const writer of [technician, assistant, investigator]) {
      expect(await offered(writer, run.id)).toEqual({ actions: ['correct'], reviewNote: null });
    }
    expect((await offered(quality, run.id)).actions).toEqual([]);

    const revision = await assistant.post(`/api/runs/${run.id}/revisions`, { reason: 'Dead volume re-measured after the seal change.' });
    expect(revision.status).toBe(201);
    expect((await offered(assistant, run.id)).actions).toEqual([]);
    expect((await offered(assistant, revision.body.id)).actions).toEqual(['edit', 'submit']);
    expect((await offered(technician, revision.body.id)).actions).toEqual([]);
  });

  it('offers nothing on a rejected run', async () => {
    const run = await draftBy(technician);
    await setState(run.id, 'rejected');
    for (const client of [technician, assistant, investigator, quality]) {
      expect((await offered(client, run.id)).actions).toEqual([]);
    }
  });
});
