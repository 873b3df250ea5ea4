// Property: every budget row's sensitivity is the derivative of r (and of W, Q, ΔU) with respect to that input,
// checked against central finite differences of the whole engine on a document altered where the input lives
// (a reading, an instrument offset, an apparatus constant). A systematic input that moves a term but is missing
// from it shows up as a row whose sensitivity disagrees with the document's finite difference.
import fc from 'fast-check';
import { checkRunDocument, type BalanceResult } from './balance';
import type { RunDocument } from './run-document';
import { affineToSi, pistonArea, R_GAS } from './units';

interface Case {
  species: 'N2' | 'CO2' | 'Ar' | 'air';
  N: number;
  gauge: boolean;
  displacement: boolean;
  celsius: boolean;
  power: boolean;
  amount: 'initialState' | 'moles' | 'mass';
  leak: boolean;
  wall: boolean;
  ratio: number;
  T0: number;
  dT: number;
}

const MOLAR_G = { N2: 28.0134, CO2: 44.0095, Ar: 39.948, air: 28.9647 };
const BORE_MM = 50;
const DEAD_L = 0.2;

function makeDoc(c: Case): RunDocument {
  const n = 0.04, N = c.N;
  const V1 = 1e-3, V2 = V1 * c.ratio;
  const V = Array.from({ length: N }, (_, i) => V1 + ((V2 - V1) * i) / (N - 1));
  const T = V.map((_, i) => c.T0 + (c.dT * i) / (N - 1));
  const P = V.map((v, i) => (n * R_GAS * T[i]) / v);
  const area = pistonArea(BORE_MM / 1000);
  const inst = (id: string, extra: Record<string, number> = {}) => ({ id, percentOfReading: 0.1, percentOfFullScale: 0.05, fullScale: 100, resolution: 0.01, calibration: { U: 0.02, k: 2 }, ...extra });
  const readings: RunDocument['readings'] = {
    time: { unit: 's', values: V.map((_, i) => 2 * i) },
    pressure: { unit: 'kPa', reference: c.gauge ? 'gauge' : 'absolute', instrument: 'P', values: P.map((p) => p / 1000 - (c.gauge ? 101.3 : 0)) },
    temperature: { unit: c.celsius ? 'degC' : 'K', instrument: 'T', values: T.map((t) => t - (c.celsius ? 273.15 : 0)) },
  };
  if (c.displacement) readings.displacement = { unit: 'mm', instrument: 'X', values: V.map((v) => ((v - DEAD_L * 1e-3) / area) * 1000) };
  else readings.volume = { unit: 'L', instrument: 'X', values: V.map((v) => v * 1000) };
  if (c.power) readings.power = { unit: 'W', instrument: 'W', values: V.map((_, i) => 0.5 + 0.01 * i) };
  else {
    readings.voltage = { unit: 'V', instrument: 'U', values: V.map((_, i) => 3 + 0.01 * i) };
    readings.current = { unit: 'A', instrument: 'I', values: V.map((_, i) => 0.15 + 0.0005 * i) };
  }
  const amount: RunDocument['amount'] = c.amount === 'moles' ? { from: 'moles', value: n, u: 1e-4 }
    : c.amount === 'mass' ? { from: 'mass', mass: { value: n * MOLAR_G[c.species], unit: 'g', u: 0.002 }, molarMass: { value: MOLAR_G[c.species], u: 0.001 } }
    : { from: 'initialState', Z: 1, uZ: 0.001 };
  return {
    format: 'qwell.run', version: 1, runDate: '2026-03-14', process: { claimed: 'free-form' },
    gas: { model: 'species', species: c.species },
    amount,
    ambient: {
      ...(c.gauge ? { pressure: { value: 1013, unit: 'hPa', u: 0.3, instrument: 'B' } } : {}),
      ...(c.leak ? { temperature: { value: 21, unit: 'degC', u: 0.1 } } : {}),
    },
    apparatus: {
      ...(c.displacement ? { pistonBore: { value: BORE_MM, unit: 'mm', u: 0.02 }, deadVolume: { value: DEAD_L, unit: 'L', u: 0.003 } } : {}),
      ...(c.leak ? { heatLossCoefficient: { value: 0.02, unit: 'W/K', u: 0.004 } } : {}),
      ...(c.wall ? { heatCapacity: { value: 3, unit: 'J/K', u: 0.1 } } : {}),
    },
    instruments: [inst('P'), inst('T', { percentOfFullScale: 0.02 }), inst('X', { percentOfReading: 0.05 }), inst('W'), inst('U'), inst('I', { fullScale: 1, resolution: 0.0001 }), { id: 'B', percentOfReading: 0.02, resolution: 0.1, calibration: { U: 0.4, k: 2 } }],
    readings,
  } as RunDocument;
}

const outputs = (doc: RunDocument): number[] => {
  const res = checkRunDocument(doc, { draws: 0 });
  if (!res.ok) throw new Error(JSON.stringify(res.errors));
  const r = res.result;
  return [r.work.measured, r.heat.total, r.internalEnergy.value, r.residual.r];
};

type Alter = (doc: RunDocument, delta: number) => void;
const channelKey: Record<string, keyof RunDocument['readings']> = { P: 'pressure', T: 'temperature', W: 'power', U: 'voltage', I: 'current' };
const clone = (d: RunDocument): RunDocument => JSON.parse(JSON.stringify(d));

/** Where in the document a budget row's input lives, and how many SI units of the row one document unit is. */
function alteration(doc: RunDocument, row: BalanceResult['budget'][number]): { alter: Alter; perUnit: number } | null {
  const key = row.group === 'X' ? (doc.readings.displacement ? 'displacement' : 'volume') : channelKey[row.group];
  if (key) {
    const ch = doc.readings[key] as { unit: string; values: number[] };
    const kind = key === 'displacement' ? 'length' : (key as 'pressure');
    let factor = affineToSi(kind, ch.unit).factor;
    if (key === 'displacement') factor *= pistonArea(doc.apparatus.pistonBore!.value / 1000);
    const last = ch.values.length - 1;
    if (row.source.endsWith('gain (% of reading)')) return { alter: (d, x) => { const c = d.readings[key] as typeof ch; c.values = c.values.map((v) => v * (1 + x)); }, perUnit: 1 };
    if (row.source.endsWith('offset (% of full scale)') || row.source.endsWith('calibration')) return { alter: (d, x) => { const c = d.readings[key] as typeof ch; c.values = c.values.map((v) => v + x); }, perUnit: factor };
    if (row.source.endsWith('random, first reading')) return { alter: (d, x) => { (d.readings[key] as typeof ch).values[0] += x; }, perUnit: factor };
    if (row.source.endsWith('random, last reading')) return { alter: (d, x) => { (d.readings[key] as typeof ch).values[last] += x; }, perUnit: factor };
    return null; // the interior readings' random part is one aggregated row (run-model.ts), not one document value
  }
  const q = (get: (d: RunDocument) => { value: number }, perUnit: number) => ({ alter: (d: RunDocument, x: number) => { get(d).value += x; }, perUnit });
  switch (row.group) {
    case 'B': return q((d) => d.ambient.pressure!, 100);
    case 'ambient temperature': return q((d) => d.ambient.temperature!, 1);
    case 'heat-loss coefficient': return q((d) => d.apparatus.heatLossCoefficient!, 1);
    case 'heat capacity': return q((d) => d.apparatus.heatCapacity!, 1);
    case 'apparatus volume': return q((d) => d.apparatus.deadVolume!, 1e-3);
    case 'piston bore': return { alter: (d, x) => { d.apparatus.pistonBore!.value *= Math.sqrt(1 + x); }, perUnit: 1 }; // area × (1 + x)
    case 'amount':
      if (row.source === 'amount n') return q((d) => d.amount as { value: number }, 1);
      if (row.source === 'gas mass m') return q((d) => (d.amount as { mass: { value: number } }).mass, 1e-3);
      if (row.source === 'molar mass M') return q((d) => (d.amount as { molarMass: { value: number } }).molarMass, 1e-3);
      return { alter: (d, x) => { (d.amount as { Z: number }).Z += x; }, perUnit: 1 };
    default: return null;
  }
}

const arb = fc.record({
  species: fc.constantFrom('N2' as const, 'CO2' as const, 'Ar' as const, 'air' as const),
  N: fc.integer({ min: 6, max: 30 }),
  gauge: fc.boolean(), displacement: fc.boolean(), celsius: fc.boolean(), power: fc.boolean(),
  amount: fc.constantFrom('initialState' as const, 'moles' as const, 'mass' as const),
  leak: fc.boolean(), wall: fc.boolean(),
  ratio: fc.double({ min: 1.2, max: 2.5, noNaN: true }),
  T0: fc.double({ min: 285, max: 320, noNaN: true }),
  dT: fc.double({ min: -8, max: 12, noNaN: true }),
});

describe('budget sensitivities are derivatives of r, W, Q and ΔU (central differences on the document)', () => {
  it('holds for random documents to 1e-6 relative', () => {
    fc.assert(fc.property(arb, (c) => {
      const doc = makeDoc(c);
      const res = checkRunDocument(doc, { draws: 0 });
      if (!res.ok) throw new Error(JSON.stringify(res.errors));
      const scale = Math.max(Math.abs(res.result.work.measured), Math.abs(res.result.heat.total), Math.abs(res.result.internalEnergy.value), 1);
      let checked = 0;
      for (const row of res.result.budget) {
        const where = alteration(doc, row);
        if (!where) continue;
        const step = (1e-3 * row.u) / where.perUnit; // in document units
        const up = clone(doc), down = clone(doc);
        where.alter(up, step);
        where.alter(down, -step);
        const fUp = outputs(up), fDown = outputs(down);
        const model = [row.sensitivities.W, row.sensitivities.Q, row.sensitivities.dU, row.sensitivity];
        for (let j = 0; j < 4; j++) {
          const fd = (fUp[j] - fDown[j]) / (2 * step * where.perUnit);
          // 1e-6 relative, with a floor for the float rounding of the outputs (1e-12 of their size over the step)
          const tol = 1e-6 * Math.abs(fd) + (1e-11 * scale) / (step * where.perUnit);
          if (!(Math.abs(fd - model[j]) <= tol)) {
            throw new Error(`${row.source} (${['W', 'Q', 'ΔU', 'r'][j]}): budget ${model[j]}, finite difference ${fd} (case ${JSON.stringify(c)})`);
          }
        }
        checked++;
      }
      expect(checked).toBeGreaterThan(10);
    }), { numRuns: 15, seed: 12 });
  });
  it('the real-gas row is the departure itself (r is linear in its relative factor)', () => {
    const doc = makeDoc({ species: 'CO2', N: 10, gauge: false, displacement: false, celsius: false, power: true, amount: 'initialState', leak: false, wall: false, ratio: 2, T0: 300, dT: 0 });
    const on = checkRunDocument(doc, { draws: 0 });
    const off = checkRunDocument({ ...doc, gas: { model: 'species', species: 'CO2', realGas: false } }, { draws: 0 });
    if (!on.ok || !off.ok) throw new Error('invalid');
    const row = on.result.budget.find((b) => b.group === 'real-gas departure')!;
    expect(row.sensitivity / (on.result.residual.r - off.result.residual.r) - 1).toBeCloseTo(0, 6);
  });
});
