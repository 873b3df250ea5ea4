import { eq } from 'drizzle-orm';
import { projects } from '../../db/schema';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { plainProblem } from './submit-checklist';

let h: ApiHarness;
let tech: ApiClient;
let projectId: number;

beforeAll(async () => {
  h = await startHarness();
  tech = await clientAs(h.app, 'technician');
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
});
afterAll(() => h.close());

type Item = { field: string; label: string; message: string };

describe('GET /api/runs/:id/checklist', () => {
  it('lists what an empty draft lacks in the form\'s words, the same as a refused submit, and changes nothing', async () => {
    const created = await tech.post('/api/runs', { projectId, title: 'Imported, not yet described', process: 'isobaric', runDate: '2026-04-01' });
    const res = await tech.get(`/api/runs/${created.body.id}/checklist`);
    expect(res.status).toBe(200);
    expect(res.body.complete).toBe(false);
    const missing = res.body.missing as Item[];
    // Without a gas the engine asks for a calorimeter's heat capacity; the person is told to choose the gas.
    expect(missing).toContainEqual({ field: 'gas', label: 'Gas', message: 'Choose the gas, or an apparatus with a measured heat capacity for a calorimeter run.' });
    expect(missing).toContainEqual({ field: 'readings', label: 'Readings', message: 'Enter or import the readings: this draft has none yet.' });
    expect(missing.map((m) => m.message).join(' ')).not.toMatch(/gas\.model|"calorimeter"/);

    const submit = await tech.post(`/api/runs/${created.body.id}/submit`, { version: created.body.version });
    expect(submit.status).toBe(400);
    expect(submit.body.errors).toEqual(missing);
    expect((await tech.get(`/api/runs/${created.body.id}`)).body.state).toBe('draft');
  });

  it('says a complete draft is complete', async () => {
    const bodies = runBodies(loadFixture('isothermal'), projectId);
    const created = await tech.post('/api/runs', bodies.create);
    await tech.put(`/api/runs/${created.body.id}/readings`, { version: created.body.version, ...bodies.readings });
    const res = await tech.get(`/api/runs/${created.body.id}/checklist`);
    expect(res.body).toMatchObject({ complete: true, missing: [] });
  });

  it('answers 404 for a run that does not exist, 403 for an administrator and 401 signed out', async () => {
    expect((await tech.get('/api/runs/999999/checklist')).status).toBe(404);
    expect((await (await clientAs(h.app, 'admin')).get('/api/runs/1/checklist')).status).toBe(403);
    expect((await (await clientAs(h.app, null)).get('/api/runs/1/checklist')).status).toBe(401);
  });
});

describe('plainProblem', () => {
  it('points a reading problem at its column and row', () => {
    expect(plainProblem('readings.pressure[1]', 'must be a finite number, got null', true, 12)).toEqual({
      field: 'readings.pressure[1]', label: 'Readings', message: 'Reading 2 of the pressure column must be a finite number, got null.',
    });
  });
  it('asks for the barometric pressure when gauge readings need it', () => {
    expect(plainProblem('ambient.pressure', 'is required because readings.pressure.reference is "gauge"', true, 12).message)
      .toBe('Give the barometric (ambient) pressure: gauge pressure needs it to become absolute.');
  });
});
