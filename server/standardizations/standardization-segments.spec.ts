// The control chart of a standardization series restarts after a recorded change to the apparatus (ASTM D240 §8.1.1).
import { eq } from 'drizzle-orm';
import { mean } from 'simple-statistics';
import { apparatus, balanceResults, people, projects, runs } from '../../db/schema';
import { demoEmail } from '../../db/seed/demo-lab';
import { individualsLimits } from '../engine/control-chart';
import { clientAs, DEMO_PASSWORD, startHarness, type ApiHarness } from '../../testing/api-harness';
import { standardizationMeanings } from './standardization-dto';

let h: ApiHarness;
let appId: number;
const tag = `BC-S${Date.now().toString(36).toUpperCase().slice(-5)}`;
// Invented demo values: the heater replaced on 2026-03-10 moved ε by about +55 J/K.
const before = [4851.2, 4849.6, 4852.8, 4850.1, 4848.9, 4851.7, 4850.4, 4849.8];
const after = [4904.1, 4906.3, 4903.8, 4905.5, 4904.9, 4906.0];

async function standardizationRun(i: number, runDate: string, value: number, authorId: number, projectId: number) {
  const db = h.handle.db;
  const [run] = await db.insert(runs).values({
    code: `${tag}-${i}`, projectId, authorId, title: `Standardization ${i}`, process: 'calorimetric', runDate, state: 'submitted', apparatusId: appId,
    setup: { gas: { model: 'calorimeter' }, purpose: 'standardization', heatSource: { kind: 'electrical' } },
  }).returning();
  await db.insert(balanceResults).values({
    runId: run.id, runVersion: run.version, engineVersion: 'spec', inputHash: `${tag}-${i}`, verdict: 'closes', en: 0.1, residual: 0, expandedUncertainty: 1,
    result: { energyEquivalent: { value, u: 3 }, heatLeakFit: { h: { value: 0.08, u: 0.002 } } },
  });
  return run.id;
}

beforeAll(async () => {
  h = await startHarness();
  const db = h.handle.db;
  [{ id: appId }] = await db.insert(apparatus).values({ tag, name: 'Bath calorimeter with a repair', kind: 'bath-calorimeter', heatCapacity: 4850, heatCapacityU: 5 }).returning();
  const [tech] = await db.select({ id: people.id }).from(people).where(eq(people.email, demoEmail('technician')));
  const [gx] = await db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
  for (const [i, v] of before.entries()) await standardizationRun(i, `2026-03-0${1 + Math.floor(i / 2)}`, v, tech.id, gx.id);
  const change = await (await clientAs(h.app, 'quality')).post(`/api/apparatus/${appId}/changes`).send({ description: 'immersion heater replaced', changedOn: '2026-03-10' });
  expect(change.status).toBe(201);
  for (const [i, v] of after.entries()) await standardizationRun(10 + i, `2026-03-${11 + Math.floor(i / 2)}`, v, tech.id, gx.id);
});
afterAll(() => h.close());

interface Item { runId: number; code: string; segment: number; current: boolean; accepted: boolean; outOfControl: boolean }

describe('a standardization series across a recorded change to the apparatus', () => {
  it('computes the chart from the runs after the change and shows the older runs as a previous segment', async () => {
    const res = await (await clientAs(h.app, 'investigator')).get(`/api/apparatus/${appId}/standardizations`);
    expect(res.status).toBe(200);
    // ISO 7870-2 individuals chart over the six later runs alone (simple-statistics for the mean)
    expect(res.body.chart.centre).toBeCloseTo(mean(after), 9);
    expect(res.body.chart).toEqual(individualsLimits(after));
    expect(res.body.summary).toMatchObject({ n: 6, days: 3, acceptance: { ok: true, reasons: [] } });
    expect(res.body.segments).toEqual([
      { index: 0, change: null, n: 8, chart: individualsLimits(before), current: false },
      { index: 1, change: { date: '2026-03-10', description: 'immersion heater replaced' }, n: 6, chart: individualsLimits(after), current: true },
    ]);
    const series = res.body.series as Item[];
    expect(series.map((s) => s.segment)).toEqual([...before.map(() => 0), ...after.map(() => 1)]);
    // Judged against their own limits, no run is out of control; only the later ones can be chosen
    expect(series.filter((s) => s.outOfControl)).toEqual([]);
    expect(series.filter((s) => s.accepted).map((s) => s.segment)).toEqual(after.map(() => 1));
  });

  it('refuses a run from before the change in a new standardization (400), and signs one from the later runs', async () => {
    const q = await clientAs(h.app, 'quality');
    const series = (await q.get(`/api/apparatus/${appId}/standardizations`)).body.series as Item[];
    const later = series.filter((s) => s.current).map((s) => s.runId);
    const old = series.find((s) => !s.current)!;
    const mixed = await q.post(`/api/apparatus/${appId}/standardizations`).send({ runIds: [...later, old.runId], password: DEMO_PASSWORD, meaning: standardizationMeanings[0] });
    expect(mixed.status).toBe(400);
    expect(mixed.body.detail).toContain(`run ${old.code} was made before the latest recorded change to the apparatus`);
    const ok = await q.post(`/api/apparatus/${appId}/standardizations`).send({ runIds: later, password: DEMO_PASSWORD, meaning: standardizationMeanings[0] });
    expect(ok.status).toBe(201);
    expect(ok.body.energyEquivalent.value).toBeCloseTo(mean(after), 9);
  });
});
