import { and, asc, eq } from 'drizzle-orm';
import { balanceResults, projects, readings } from '../../db/schema';
import { checkRunDocument, ENGINE_VERSION, type RunDocument } from '../engine';
import { clientAs, eventually, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { pdfTextRuns } from '../../testing/pdf-text';
import { runOffThread } from '../core/off-thread';
import { checkOffThread } from './check-off-thread';

// A certificate in the register states a correction; a stored run's balance check applies it to the readings of the
// thermometer bound to that run (GUM, JCGM 100:2008 §3.2.3: correct for every recognised systematic effect;
// §3.2.4: the certificate's U is the uncertainty of that correction). Certificate values are invented demo data.
let h: ApiHarness;
let tech: ApiClient;
let investigator: ApiClient;
let quality: ApiClient;
let projectId: number;

const gain = 1.0004;
const offset = -0.05;
const tag = `TX-${Date.now().toString(36).toUpperCase()}`;
const name = 'Pt100 probe, spec bath';
let instrumentId: number;
let run: { id: number; code: string };
let stored: { result: Record<string, any> };

beforeAll(async () => {
  h = await startHarness({}, { worker: true });
  [tech, investigator, quality] = await Promise.all([clientAs(h.app, 'technician'), clientAs(h.app, 'investigator'), clientAs(h.app, 'quality')]);
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));

  const created = await quality.post('/api/instruments', { tag, name, kind: 'temperature', unit: 'degC', spec: { resolution: 0.001 } });
  expect(created.status).toBe(201);
  instrumentId = created.body.id;
  // In force on the run date (2026-03-14): gain and offset applied.
  const inForce = await quality.post(`/api/instruments/${instrumentId}/calibrations`, {
    calibratedOn: '2025-12-01', dueOn: '2026-12-01', certificate: 'HIAT-CAL-7001', expandedUncertainty: 0.01, coverageFactor: 2, corrections: { gain, offset },
  });
  expect(inForce.status).toBe(201);
  // Made after the run date: not in force for this run, so its offset must not be applied.
  const later = await quality.post(`/api/instruments/${instrumentId}/calibrations`, {
    calibratedOn: '2026-04-01', dueOn: '2027-04-01', certificate: 'HIAT-CAL-7102', expandedUncertainty: 0.01, coverageFactor: 2, corrections: { offset: 0.9 },
  });
  expect(later.status).toBe(201);

  const doc = loadFixture('calorimetric');
  const bodies = runBodies(doc, projectId);
  const { instrument: _described, ...temperature } = doc.readings.temperature;
  const made = await tech.post('/api/runs', bodies.create);
  expect(made.status).toBe(201);
  const put = await tech.put(`/api/runs/${made.body.id}/readings`, {
    version: made.body.version, ...bodies.readings, channels: { ...bodies.readings.channels, temperature: { ...temperature, instrumentId } },
  });
  expect(put.status).toBe(200);
  expect((await tech.post(`/api/runs/${made.body.id}/submit`, { version: put.body.version })).status).toBe(202);
  run = { id: made.body.id, code: made.body.code };
  stored = await eventually(async () => {
    const res = await investigator.get(`/api/runs/${run.id}/balance`);
    return res.status === 200 ? res.body : undefined;
  }, 30_000, 'the balance result');
}, 90_000);
afterAll(() => h.close());

/** The fixture with the register thermometer described in the run and its readings corrected by hand: t × gain + offset. */
function correctedByHand(): RunDocument {
  const doc = loadFixture('calorimetric');
  doc.instruments = doc.instruments.filter((i) => i.id !== 'TC-9');
  doc.instruments.push({ id: tag, name, resolution: 0.001, calibration: { U: 0.01, k: 2 }, calibrationDate: '2025-12-01', dueDate: '2026-12-01' });
  doc.readings.temperature = { ...doc.readings.temperature, instrument: tag, values: doc.readings.temperature.values.map((t) => t * gain + offset) };
  return doc;
}

/** Equal but for the rounding of the stored SI readings (°C → K → °C), relative 1e-9. */
const close = (a: number, b: number) => expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(b)));

describe('a stored run whose thermometer\'s certificate states a correction', () => {
  it('gets the ΔU, Q, W, U(r), En and verdict of the same run corrected by hand from the certificate\'s values', () => {
    const byHand = checkRunDocument(correctedByHand(), { draws: 2000 });
    if (!byHand.ok) throw new Error(JSON.stringify(byHand.errors));
    const r = stored.result;
    const e = byHand.result;
    close(r.internalEnergy.value, e.internalEnergy.value);
    close(r.heat.total, e.heat.total);
    close(r.work.measured, e.work.measured);
    close(r.residual.r, e.residual.r);
    close(r.residual.U, e.residual.U);
    close(r.En, e.En!);
    close(r.temperatureRise.corrected.value, e.temperatureRise!.corrected.value);
    expect(r.verdict).toBe(e.verdict);
    // and not the uncorrected run's: ΔU = C·ΔT moves with the gain (4.5 kJ/K × 0.0004 × ~1.19 K ≈ 2.1 J)
    const raw = checkRunDocument({ ...correctedByHand(), readings: { ...correctedByHand().readings, temperature: { ...loadFixture('calorimetric').readings.temperature, instrument: tag } } }, { draws: 0 });
    if (!raw.ok) throw new Error('raw invalid');
    expect(Math.abs(r.internalEnergy.value - raw.result.internalEnergy.value)).toBeGreaterThan(1);
  });

  it('records the correction it applied, from the certificate in force only, and the engine version that applied it', async () => {
    expect(stored.result.corrections).toEqual([{ reading: 'temperature', instrument: tag, instrumentName: name, certificate: 'HIAT-CAL-7001', gain, offset, unit: 'degC' }]);
    expect(stored.result.engineVersion).toBe(ENGINE_VERSION);
    const [row] = await h.handle.db.select({ engineVersion: balanceResults.engineVersion }).from(balanceResults)
      .where(and(eq(balanceResults.runId, run.id), eq(balanceResults.current, true)));
    expect(row.engineVersion).toBe(ENGINE_VERSION);
  });

  it('keeps the readings as the bench entered them', async () => {
    const [first] = await h.handle.db.select({ temperature: readings.temperature }).from(readings).where(eq(readings.runId, run.id)).orderBy(asc(readings.seq)).limit(1);
    // 20.001 °C as entered, stored in K (T/K = t/°C + 273.15), not 20.001 × 1.0004 − 0.05.
    expect(first.temperature).toBeCloseTo(20.001 + 273.15, 9);
  });

  it('exports a run document that states the correction beside the readings as entered; the stateless check and its worker thread agree', async () => {
    const res = await investigator.get(`/api/runs/${run.id}/document`);
    expect(res.status).toBe(200);
    const doc = res.body as RunDocument;
    expect(doc.readings.temperature.values[0]).toBeCloseTo(20.001, 9);
    expect(doc.instruments.find((i) => i.id === tag)!.calibration).toEqual({ U: 0.01, k: 2, correction: { certificate: 'HIAT-CAL-7001', gain, offset, unit: 'degC' } });
    const stateless = await investigator.post('/api/balance', doc);
    expect(stateless.status).toBe(200);
    expect(stateless.body.corrections).toEqual(stored.result.corrections);
    close(stateless.body.residual.r, stored.result.residual.r);
    const settings = { draws: 2000, seed: 3 };
    const inline = checkRunDocument(doc, settings);
    expect(await checkOffThread(doc, settings)).toEqual(inline);
    // The worker that reads a large POST /api/balance body (from 512 kB) from its bytes: the same answer.
    const fromBytes = await runOffThread(require.resolve('./balance-service'), 'checkDocumentBytes', [Buffer.from(JSON.stringify(doc)), settings]);
    if (!inline.ok) throw new Error('exported document invalid');
    expect(fromBytes).toEqual(inline.result);
  }, 60_000);

  it('says so in the printed report, in the lab\'s words and units', async () => {
    const res = await investigator.agent.get(`/api/runs/${run.id}/report.pdf`).buffer(true).parse((r, done) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    const text = pdfTextRuns(res.body as Buffer).replace(/\s+/g, ' ');
    // Helvetica has no × or −: the report spells them x and - (pdf-layout.ts).
    expect(text).toContain(`Temperature readings corrected by certificate HIAT-CAL-7001 of ${tag}: x 1.0004 - 0.05 °C.`);
    expect(text).toContain('the readings stored are as entered');
  });
});

describe('calibration corrections in the register', () => {
  it('refuses a gain of 0 or less, a non-number and an unknown key, saying which', async () => {
    const base = { calibratedOn: '2026-05-01', dueOn: '2027-05-01', certificate: 'HIAT-CAL-7200', expandedUncertainty: 0.01 };
    const zero = await quality.post(`/api/instruments/${instrumentId}/calibrations`, { ...base, corrections: { gain: 0 } });
    expect(zero.status).toBe(400);
    expect(zero.body.errors).toEqual([{ field: 'corrections.gain', message: 'corrections.gain must be greater than 0 (1 means no gain correction)' }]);
    const text = await quality.post(`/api/instruments/${instrumentId}/calibrations`, { ...base, corrections: { offset: 'minus a bit' } });
    expect(text.status).toBe(400);
    expect(text.body.errors.map((e: { field: string }) => e.field)).toEqual(['corrections.offset']);
    const extra = await quality.post(`/api/instruments/${instrumentId}/calibrations`, { ...base, corrections: { offset: 0.1, slope: 2 } });
    expect(extra.status).toBe(400);
    expect(JSON.stringify(extra.body.errors)).toContain('slope');
  });
});
