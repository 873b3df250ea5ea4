// Demo lab: a standardization history for bath calorimeter BC-1 — nine electrical standardization runs over
// four days (one of them out of control: invented "stirrer slipped" run), and an approved standardization from
// six in-control runs. Every number here is invented demo data, generated from Newton's law plus noise.
import { eq } from 'drizzle-orm';
import { recordAudit } from '../../server/audit/audit-service';
import { evaluateBalance, sha256Canonical } from '../../server/engine';
import { createRng } from '../../server/engine/random';
import { addDays } from '../../server/instruments/calibration-status';
import { approvalMeanings } from '../../server/runs/review-dto';
import { loadRunDocument } from '../../server/runs/run-loader';
import type { RunSetup } from '../../server/runs/run-setup';
import { insertReadings } from '../../server/runs/readings-bulk';
import { nextCode } from '../../server/runs/run-code';
import { signedHash } from '../../server/runs/signature-hash';
import { standardizationMeanings } from '../../server/standardizations/standardization-dto';
import { standardizationFigures } from '../../server/standardizations/standardization-figures';
import { acceptanceRuleFromEnv } from '../../server/standardizations/standardization-settings';
import type { Tx } from '../client';
import { apparatus, balanceResults, instruments, runs, signatures, standardizations } from '../schema';
import type { DemoContext } from './demo-runs';

/** Days before the seeding day, and the relative deviation of the bath's true heat capacity in that run (invented). */
const DEMO_SERIES: Array<{ daysAgo: number; deviation: number; note?: string }> = [
  { daysAgo: 24, deviation: 0.0006 }, { daysAgo: 24, deviation: -0.0004 },
  { daysAgo: 22, deviation: 0.0002 }, { daysAgo: 22, deviation: -0.0008 },
  { daysAgo: 21, deviation: 0.0005 }, { daysAgo: 21, deviation: 0.04, note: 'stirrer belt slipped during the main period' },
  { daysAgo: 17, deviation: -0.0002 }, { daysAgo: 17, deviation: 0.0003 }, { daysAgo: 17, deviation: -0.0006 },
];
const C_BATH = 4852; // J/K, the invented "true" energy equivalent of BC-1
const JACKET_C = 21.0; // °C
const K_COOL = 2.5e-5; // 1/s

/** An electrical standardization record: 300 s fore-period, 20 W for 300 s, 600 s after-period, every 5 s. */
export function demoStandardizationReadings(C: number, seed: number) {
  const rng = createRng(seed);
  const t: number[] = [], T: number[] = [], U: number[] = [], I: number[] = [];
  let temp = 20.0 + 0.05 * rng.normal();
  for (let s = 0; s <= 1200; s += 5) {
    const on = s >= 300 && s < 600;
    t.push(s);
    T.push(Math.round((temp + 0.0003 * rng.normal()) * 1000) / 1000);
    U.push(on ? Math.round((10 + 0.002 * rng.normal()) * 1000) / 1000 : 0);
    I.push(on ? Math.round((2 + 0.0005 * rng.normal()) * 10000) / 10000 : 0);
    const Teq = JACKET_C + (on ? 20 / (C * K_COOL) : 0); // exact step of dT/dt = P/C + k(T∞ − T)
    temp = Teq + (temp - Teq) * Math.exp(-K_COOL * 5);
  }
  return { t, T, U, I };
}

export async function seedDemoStandardizations(tx: Tx, ctx: DemoContext, labName: string): Promise<void> {
  const [bc1] = await tx.select().from(apparatus).where(eq(apparatus.tag, 'BC-1'));
  const reg = Object.fromEntries((await tx.select().from(instruments)).map((i) => [i.tag, i.id]));
  const project = ctx.projects.find((p) => p.code === 'CB')!;
  const technician = ctx.byRole['technician'];
  const investigator = ctx.byRole['investigator'];
  const chosen: Array<{ id: number; runDate: string; energyEquivalent: { value: number; u: number }; heatLoss: { value: number; u: number } | null; inputHash: string }> = [];
  for (const [i, demo] of DEMO_SERIES.entries()) {
    const runDate = addDays(ctx.today, -demo.daysAgo);
    const r = demoStandardizationReadings(C_BATH * (1 + demo.deviation), 1300 + i);
    const setup: RunSetup = {
      gas: { model: 'calorimeter' }, purpose: 'standardization', heatSource: { kind: 'electrical' },
      ambient: { temperature: { value: JACKET_C, unit: 'degC', u: 0.1 } }, apparatusSource: 'register',
      time: { unit: 's' },
      channels: { temperature: { unit: 'degC', instrumentId: reg['TC-9'] }, voltage: { unit: 'V', instrumentId: reg['DV-4'] }, current: { unit: 'A', instrumentId: reg['DA-5'] } },
      ...(demo.note ? { notes: demo.note } : {}),
    };
    const code = await nextCode(tx, runDate);
    const [run] = await tx.insert(runs).values({
      code, projectId: project.id, authorId: technician.id, title: `Electrical standardization of BC-1, ${runDate} #${(i % 3) + 1}`,
      process: 'calorimetric', runDate, apparatusId: bc1.id, setup: setup as Record<string, unknown>, state: 'approved',
    }).returning();
    const rows = r.t.map((time, j) => ({ seq: j + 1, time, pressure: null, volume: null, displacement: null, temperature: r.T[j] + 273.15, voltage: r.U[j], current: r.I[j], power: null }));
    await insertReadings(tx, run.id, rows);
    const doc = await loadRunDocument(tx, run, labName);
    const result = evaluateBalance(doc, { draws: 2000 });
    const [stored] = await tx.insert(balanceResults).values({
      runId: run.id, runVersion: run.version, engineVersion: result.engineVersion, inputHash: result.inputHash, verdict: result.verdict,
      en: result.En, residual: result.residual.r, expandedUncertainty: result.residual.U, result: { ...result, standardization: null } as unknown as Record<string, unknown>,
    }).returning();
    await tx.insert(signatures).values({ runId: run.id, signerId: investigator.id, action: 'approve', meaning: approvalMeanings[0], signedHash: signedHash(run, rows, stored) });
    await tx.update(runs).set({ verdict: result.verdict, submittedAt: new Date(), version: run.version + 1, decidedAt: new Date() }).where(eq(runs.id, run.id));
    await recordAudit(tx, { action: 'seed.run', entityType: 'run', entityId: run.id, after: { code, state: 'approved', purpose: 'standardization' }, reason: 'demo data' });
    const ee = result.energyEquivalent;
    if (ee && !demo.note && chosen.length < 6) chosen.push({ id: run.id, runDate, energyEquivalent: { value: ee.value, u: ee.u }, heatLoss: result.heatLeakFit?.h ?? null, inputHash: result.inputHash });
  }
  const rule = acceptanceRuleFromEnv();
  const f = standardizationFigures(chosen, rule);
  const quality = ctx.byRole['quality'];
  const effectiveFrom = addDays(ctx.today, -16); // the day after the sixth chosen run
  const [std] = await tx.insert(standardizations).values({
    apparatusId: bc1.id, energyEquivalent: f.energyEquivalent.value, energyEquivalentU: f.energyEquivalent.u,
    heatLossCoefficient: f.heatLossCoefficient?.value ?? null, heatLossCoefficientU: f.heatLossCoefficient?.u ?? null,
    runIds: chosen.map((c) => c.id), effectiveFrom, signerId: quality.id, meaning: standardizationMeanings[0],
    summary: { n: f.summary.n, days: f.summary.days, mean: f.summary.mean, sd: f.summary.sd, uMean: f.summary.uMean, rsd: f.summary.rsd, chart: f.summary.chart, rule },
    signedHash: sha256Canonical({ apparatusId: bc1.id, runs: chosen.map((c) => ({ id: c.id, inputHash: c.inputHash, energyEquivalent: c.energyEquivalent })) }),
    signedAt: new Date(`${effectiveFrom}T16:00:00Z`),
  }).returning();
  await recordAudit(tx, { action: 'seed.standardization', entityType: 'apparatus', entityId: bc1.id, after: { standardizationId: std.id, energyEquivalent: std.energyEquivalent }, reason: 'demo data' });
}
