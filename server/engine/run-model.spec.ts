import { checkRunDocument, type BalanceResult } from './balance';
import type { RunDocument } from './run-document';
import { R_GAS, toSi } from './units';

const check = (doc: unknown): BalanceResult => {
  const res = checkRunDocument(doc, { draws: 0 });
  if (!res.ok) throw new Error(JSON.stringify(res.errors));
  return res.result;
};

/** Argon heated in a rigid 10 L vessel of wall heat capacity 5 J/K: n·Cv·ΔT + C·ΔT = Q_el (first law, W = 0). */
function heatedVessel(): RunDocument {
  const n = 0.4, C = 5, T1 = 295, dT = 2, N = 21, cv = 1.5 * R_GAS; // Ar: Cv = 3R/2 (ideal monatomic)
  const Qel = (n * cv + C) * dT, power = Qel / (N - 1);
  const T = Array.from({ length: N }, (_, i) => T1 + (dT * i) / (N - 1));
  return {
    format: 'qwell.run', version: 1, runDate: '2026-03-14', process: { claimed: 'isochoric' },
    gas: { model: 'species', species: 'Ar', realGas: false },
    amount: { from: 'moles', value: n, u: 0.0001 },
    ambient: {},
    apparatus: { vesselVolume: { value: 10, unit: 'L', u: 0.02 }, heatCapacity: { value: C, unit: 'J/K', u: 0.05 } },
    instruments: [{ id: 'T', calibration: { U: 0.02, k: 2 }, resolution: 0.001 }, { id: 'PM', percentOfReading: 0.1 }, { id: 'PG', percentOfReading: 0.05 }],
    readings: {
      time: { unit: 's', values: T.map((_, i) => i) },
      pressure: { unit: 'Pa', reference: 'absolute', instrument: 'PG', values: T.map((t) => (n * R_GAS * t) / 1e-2) },
      temperature: { unit: 'K', instrument: 'T', values: T },
      power: { unit: 'W', instrument: 'PM', values: T.map(() => power) },
    },
  };
}

describe('wall heat of a gas vessel (issue 12, finding 1)', () => {
  it('enters Q as C·(T_last − T_first), so a clean run closes', () => {
    const r = check(heatedVessel());
    // C·ΔT = 5 J/K × 2 K = 10 J (first law with the wall as part of the surroundings, DESIGN §2)
    expect(r.heat.wall).toBeCloseTo(10, 9);
    expect(r.residual.r).toBeCloseTo(0, 6);
    expect(r.verdict).toBe('closes');
  });
  it('shows C in the budget with ∂Q/∂C = −ΔT', () => {
    const row = check(heatedVessel()).budget.find((b) => b.group === 'heat capacity')!;
    expect(row.u).toBe(0.05);
    expect(row.sensitivities.Q).toBeCloseTo(-2, 9);
  });
  it('a fixed wallUptake still works, but not together with C', () => {
    const doc = heatedVessel();
    const fixed = { ...doc, apparatus: { vesselVolume: doc.apparatus.vesselVolume, wallUptake: { value: 10, unit: 'J', u: 0.1 } } };
    expect(check(fixed).heat.wall).toBe(10);
    expect(check(fixed).verdict).toBe('closes');
    const both = checkRunDocument({ ...doc, apparatus: { ...doc.apparatus, wallUptake: { value: 100, unit: 'J' } } });
    expect(both.ok).toBe(false);
    if (!both.ok) expect(both.errors[0].path).toBe('apparatus.wallUptake');
  });
});

/** N2 isothermal expansion with n from the initial state, volume channel with offsets (full scale, calibration). */
function offsetVolume(): RunDocument {
  const N = 21, T = 300, n = 0.04, V1 = 1e-3, V2 = 2e-3;
  const V = Array.from({ length: N }, (_, i) => V1 + ((V2 - V1) * i) / (N - 1));
  return {
    format: 'qwell.run', version: 1, runDate: '2026-03-14', process: { claimed: 'isothermal' },
    gas: { model: 'species', species: 'N2', realGas: false },
    amount: { from: 'initialState' },
    ambient: {}, apparatus: {},
    instruments: [
      { id: 'V', percentOfFullScale: 1, fullScale: 2, calibration: { U: 0.01, k: 2 } }, // L
      { id: 'P', percentOfReading: 0.05 }, { id: 'T', calibration: { U: 0.02, k: 2 } }, { id: 'PM', percentOfReading: 0.1 },
    ],
    readings: {
      time: { unit: 's', values: V.map((_, i) => i) },
      pressure: { unit: 'Pa', reference: 'absolute', instrument: 'P', values: V.map((v) => (n * R_GAS * T) / v) },
      volume: { unit: 'L', instrument: 'V', values: V.map((v) => v * 1e3) },
      temperature: { unit: 'K', instrument: 'T', values: V.map((_, i) => T + i / (N - 1)) },
      power: { unit: 'W', instrument: 'PM', values: V.map(() => 1) },
    },
  };
}

describe('volume offsets enter n = P1V1/(ZRT1) (issue 12, finding 4)', () => {
  it('the full-scale and calibration offsets of the volume channel have ∂ΔU/∂b = ΔU/V1', () => {
    const r = check(offsetVolume());
    const dU = r.internalEnergy.value;
    // ΔU = n·Cv·ΔT with n ∝ V1: ∂ΔU/∂V1 = ΔU/V1 (V1 = 1e-3 m³); W does not move with a common offset (∫P dV)
    for (const name of ['offset (% of full scale)', 'calibration']) {
      const row = r.budget.find((b) => b.group === 'V' && b.source.includes(name))!;
      expect(row.sensitivities.dU / (dU / 1e-3) - 1).toBeCloseTo(0, 6);
      expect(row.sensitivities.W).toBeCloseTo(0, 6);
    }
  });
});

describe('units labs log in (issue 12, finding 8)', () => {
  it('time in ms and the barometer in hPa (SI prefixes, SI Brochure 9th ed. Table 7)', () => {
    expect(toSi('time', 'ms', 1500)).toBe(1.5);
    expect(toSi('pressure', 'hPa', 1013.25)).toBeCloseTo(101325, 9);
    const doc = heatedVessel();
    const inMs = { ...doc, readings: { ...doc.readings, time: { unit: 'ms' as const, values: doc.readings.time.values.map((t) => (t as number) * 1000) } } };
    expect(check(inMs).heat.electrical).toBeCloseTo(check(doc).heat.electrical, 9);
  });
  it('the barometer is an instrument of the register with its own budget row', () => {
    const doc = offsetVolume();
    const P = doc.readings.pressure!;
    const gauge: RunDocument = {
      ...doc,
      ambient: { pressure: { value: 1000, unit: 'hPa', instrument: 'BA-1' } },
      instruments: [...doc.instruments, { id: 'BA-1', name: 'barometer', calibration: { U: 0.6, k: 2 }, resolution: 0.1 }],
      readings: { ...doc.readings, pressure: { ...P, reference: 'gauge', values: P.values.map((p) => p - 1e5) } },
    };
    const r = check(gauge);
    const row = r.budget.find((b) => b.group === 'BA-1')!;
    // u = √((0.6/2)² + (0.1/√12)²) hPa (GUM 7.2.3 and F.2.2.1), in Pa
    expect(row.u).toBeCloseTo(100 * Math.hypot(0.3, 0.1 / Math.sqrt(12)), 9);
    expect(row.source).toMatch(/barometric pressure \(BA-1 barometer\)/);
  });
  it('a barometer id that names no instrument is refused with its path', () => {
    const doc = offsetVolume();
    const res = checkRunDocument({ ...doc, ambient: { pressure: { value: 1000, unit: 'hPa', instrument: 'NONE' } } });
    expect(res.ok).toBe(false);
    if (!res.ok) expect(res.errors.map((e) => e.path)).toContain('ambient.pressure.instrument');
  });
});

describe('free-form process (issue 12, finding 7)', () => {
  it('is accepted, has no model work and raises no claim flags', () => {
    const r = check({ ...offsetVolume(), process: { claimed: 'free-form' } });
    expect(r.work.model).toBeNull();
    expect(r.work.modelFormula).toMatch(/no named process/);
    expect(r.polytropicFit!.claimedIndex).toBeNull();
    expect(r.flags.filter((f) => ['ISOTHERMAL_DRIFT', 'INDEX_FAR_FROM_CLAIM', 'ISOCHORIC_VOLUME_CHANGE', 'ADIABATIC_HEATER_POWER'].includes(f.code))).toEqual([]);
  });
});
