// The lab setting QWELL_USE_FITTED_HEAT_LOSS: runs pinned to a standardization use its fitted h and u(h), and
// their stored result says so.
import { eq } from 'drizzle-orm';
import { apparatus, balanceResults, people, projects, runs, standardizations } from '../../db/schema';
import { demoEmail } from '../../db/seed/demo-lab';
import { runBalanceCheck } from '../balance/balance-check';
import { loadRunDocument } from '../runs/run-loader';
import { clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { useFittedHeatLossFromEnv } from './standardization-settings';

let h: ApiHarness;
let runId: number;
let version: number;
const REGISTER_H = { value: 0.3, u: 0.01 };
const FITTED_H = { value: 0.0812, u: 0.0023 };

beforeAll(async () => {
  h = await startHarness();
  const db = h.handle.db;
  const tag = `BC-H${Date.now().toString(36).toUpperCase().slice(-5)}`;
  const [app] = await db.insert(apparatus).values({ tag, name: 'Bath calorimeter for the h setting', kind: 'bath-calorimeter', heatCapacity: 4500, heatCapacityU: 4, heatLossCoefficient: REGISTER_H.value, heatLossCoefficientU: REGISTER_H.u }).returning();
  const [quality] = await db.select({ id: people.id }).from(people).where(eq(people.email, demoEmail('quality')));
  await db.insert(standardizations).values({
    apparatusId: app.id, energyEquivalent: 4500, energyEquivalentU: 4, heatLossCoefficient: FITTED_H.value, heatLossCoefficientU: FITTED_H.u,
    runIds: [], summary: {}, effectiveFrom: '2026-01-01', signerId: quality.id, meaning: 'test standardization', signedHash: 'test',
  });
  const [{ id: projectId }] = await db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
  const bodies = runBodies(loadFixture('calorimetric'), projectId);
  const tech = await clientAs(h.app, 'technician');
  // The register's apparatus, without h typed for the run: the pinned standardization or the register supplies it.
  const created = await tech.post('/api/runs', { ...bodies.create, apparatusId: app.id, setup: { ...bodies.create.setup, apparatus: { name: app.name } } });
  expect(created.status).toBe(201);
  const put = await tech.put(`/api/runs/${created.body.id}/readings`, { version: created.body.version, ...bodies.readings });
  expect(put.status).toBe(200);
  const submitted = await tech.post(`/api/runs/${created.body.id}/submit`, { version: put.body.version });
  expect(submitted.status).toBe(202);
  runId = created.body.id;
  version = submitted.body.version;
});
afterAll(() => h.close());

async function check(useFittedHeatLoss: boolean) {
  expect(await runBalanceCheck(h.handle.db, { ...h.config, useFittedHeatLoss }, runId, version)).toBe('stored');
  const [row] = await h.handle.db.select().from(balanceResults).where(eq(balanceResults.runId, runId)).orderBy(balanceResults.id).limit(1).offset(useFittedHeatLoss ? 1 : 0);
  return row.result as unknown as { heat: { leak: number; u: number }; standardization: { heatLossCoefficient: { value: number; u: number } | null; heatLossApplied: boolean } };
}

describe('QWELL_USE_FITTED_HEAT_LOSS', () => {
  it('is off by default and reads 1/0, on/off; anything else stops the server with a message', () => {
    expect(useFittedHeatLossFromEnv({})).toBe(false);
    expect(useFittedHeatLossFromEnv({ QWELL_USE_FITTED_HEAT_LOSS: '1' })).toBe(true);
    expect(useFittedHeatLossFromEnv({ QWELL_USE_FITTED_HEAT_LOSS: 'on' })).toBe(true);
    expect(useFittedHeatLossFromEnv({ QWELL_USE_FITTED_HEAT_LOSS: 'off' })).toBe(false);
    expect(() => useFittedHeatLossFromEnv({ QWELL_USE_FITTED_HEAT_LOSS: 'yes please' })).toThrow(/QWELL_USE_FITTED_HEAT_LOSS must be 1 or 0/);
  });

  it('leaves the register\'s h in the run document when off, and puts the standardization\'s fitted h and u(h) there when on', async () => {
    const [run] = await h.handle.db.select().from(runs).where(eq(runs.id, runId));
    const off = await loadRunDocument(h.handle.db, run, 'lab');
    const on = await loadRunDocument(h.handle.db, run, 'lab', { useFittedHeatLoss: true });
    expect(off.apparatus?.heatLossCoefficient).toEqual({ value: REGISTER_H.value, unit: 'W/K', u: REGISTER_H.u });
    expect(on.apparatus?.heatLossCoefficient).toEqual({ value: FITTED_H.value, unit: 'W/K', u: FITTED_H.u });
    // ε comes from the standardization either way
    expect(on.apparatus?.heatCapacity).toEqual({ value: 4500, unit: 'J/K', u: 4 });
  });

  it('is shown on the apparatus overview, so the page can say whether runs use the fitted h', async () => {
    const [run] = await h.handle.db.select({ apparatusId: runs.apparatusId }).from(runs).where(eq(runs.id, runId));
    const res = await (await clientAs(h.app, 'technician')).get(`/api/apparatus/${run.apparatusId}/standardizations`);
    expect(res.status).toBe(200);
    expect(res.body.useFittedHeatLoss).toBe(h.config.useFittedHeatLoss);
    expect(res.body.current.heatLossCoefficient).toEqual(FITTED_H);
  });

  it('makes the stored balance use the fitted h (the leak scales with h) and record that it did', async () => {
    const off = await check(false);
    const on = await check(true);
    expect(off.standardization.heatLossApplied).toBe(false);
    expect(on.standardization).toMatchObject({ heatLossApplied: true, heatLossCoefficient: FITTED_H });
    // The leak ∫h·(T − T_amb) dt is linear in h (DESIGN §2, Newtonian cooling): its ratio is the ratio of the two h.
    expect(off.heat.leak).not.toBe(0);
    expect(on.heat.leak / off.heat.leak).toBeCloseTo(FITTED_H.value / REGISTER_H.value, 9);
  });
});
