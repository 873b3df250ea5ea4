import { eq } from 'drizzle-orm';
import { mailOutbox, projects } from '../../db/schema';
import { clientAs, eventually, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';

// A stored run that breaks its balance, read by a register thermometer whose certificate in force states a correction:
// the sentence of why beside the verdict and the mail about the break name that certificate, since the verdict is about
// the corrected readings (GUM, JCGM 100:2008 §3.2.3). Certificate values are invented demo data.
let h: ApiHarness;
let tech: ApiClient;
let investigator: ApiClient;
const tag = `TW-${Date.now().toString(36).toUpperCase()}`;
let run: { id: number; code: string };
let why: string;

beforeAll(async () => {
  h = await startHarness({}, { worker: true });
  const quality = await clientAs(h.app, 'quality');
  [tech, investigator] = await Promise.all([clientAs(h.app, 'technician'), clientAs(h.app, 'investigator')]);
  const [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));

  const created = await quality.post('/api/instruments', { tag, name: 'Pt100 probe, spare bath', kind: 'temperature', unit: 'degC', spec: { resolution: 0.001 } });
  expect(created.status).toBe(201);
  // In force on the fixture's run date, 2026-03-14.
  const cal = await quality.post(`/api/instruments/${created.body.id}/calibrations`, {
    calibratedOn: '2025-12-01', dueOn: '2026-12-01', certificate: 'HGT-CAL-2026-118', expandedUncertainty: 0.01, coverageFactor: 2, corrections: { gain: 1.0004, offset: -0.05 },
  });
  expect(cal.status).toBe(201);

  // The demo run whose heat leak was left out: it breaks with or without the correction.
  const doc = loadFixture('calorimetric-heat-leak-forgotten');
  const bodies = runBodies(doc, projectId);
  const { instrument: _described, ...temperature } = doc.readings.temperature;
  const made = await tech.post('/api/runs', bodies.create);
  expect(made.status).toBe(201);
  const put = await tech.put(`/api/runs/${made.body.id}/readings`, {
    version: made.body.version, ...bodies.readings, channels: { ...bodies.readings.channels, temperature: { ...temperature, instrumentId: created.body.id } },
  });
  expect(put.status).toBe(200);
  expect((await tech.post(`/api/runs/${made.body.id}/submit`, { version: put.body.version })).status).toBe(202);
  run = { id: made.body.id, code: made.body.code };
  const stored = await eventually(async () => {
    const res = await investigator.get(`/api/runs/${run.id}/balance`);
    return res.status === 200 ? res.body : undefined;
  }, 30_000, 'the balance result');
  expect(stored.result.verdict).toBe('breaks');
  expect(stored.result.corrections).toHaveLength(1);
  why = stored.why;
}, 90_000);
afterAll(() => h.close());

describe('a breaking run whose thermometer was corrected by its certificate', () => {
  it('says why, then names the certificate that corrected the readings', () => {
    expect(why).toMatch(/^No heat leak was accounted for: a heat-loss coefficient h ≈ [0-9.]+ W\/K would close the balance\. /);
    expect(why.endsWith(` Readings corrected by certificate HGT-CAL-2026-118 (${tag}) before the check.`)).toBe(true);
  });

  it('mails the same sentence to the author and the investigators', async () => {
    const mails = await eventually(async () => {
      const rows = await h.handle.db.select().from(mailOutbox).where(eq(mailOutbox.subject, `Run ${run.code}: the energy balance breaks`));
      return rows.length > 0 ? rows : undefined;
    }, 10_000, 'the mail about the break');
    for (const mail of mails) expect(mail.body).toContain(`Why: ${why}\n`);
    expect(mails[0].body).toContain(`Readings corrected by certificate HGT-CAL-2026-118 (${tag}) before the check.`);
  });
});
