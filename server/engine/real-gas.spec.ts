import { checkRunDocument } from './balance';
import type { RunDocument } from './run-document';
import { criticalConstants, departureAtPressure, departureAtVolume, secondVirial, secondVirialSlope } from './real-gas';
import { R_GAS } from './units';

describe('second virial coefficient, Tsonopoulos (AIChE J. 20, 1974)', () => {
  // REFERENCES §8b: B(T) in cm³/mol computed with CoolProp 8.0.0 (reference equations of state). The correlation is
  // good to a few cm³/mol for simple gases; tolerance max(3 cm³/mol, 3 %).
  it.each([
    ['CO2', 250, -184.0], ['CO2', 275, -148.0], ['CO2', 300, -121.3],
    ['Ar', 250, -27.6], ['Ar', 275, -20.7], ['Ar', 300, -15.2],
    ['N2', 250, -16.4], ['N2', 275, -9.9], ['N2', 300, -4.6],
  ] as const)('%s at %s K: %s cm³/mol', (species, T, B) => {
    const got = secondVirial(criticalConstants(species)!, T) * 1e6;
    expect(Math.abs(got - B)).toBeLessThanOrEqual(Math.max(3, 0.03 * Math.abs(B)));
  });
  it('dB/dT is the derivative of B (central difference, step 1 mK)', () => {
    const c = criticalConstants('CO2')!;
    const fd = (secondVirial(c, 300.001) - secondVirial(c, 299.999)) / 0.002;
    expect(secondVirialSlope(c, 300) / fd - 1).toBeCloseTo(0, 7);
  });
  it('He is left to the ideal gas (quantum gas, outside the correlation)', () => {
    expect(criticalConstants('He')).toBeNull();
  });
  it('the pressure and volume forms agree to second-virial order at 1 bar', () => {
    // U − U° = −T·P·B′ = −R·T²·B′/V_m with V_m = RT/P + B (common practice)
    const c = criticalConstants('N2')!;
    const T = 300, P = 1e5, Vm = (R_GAS * T) / P + secondVirial(c, T);
    expect(departureAtVolume(c, T, Vm) / departureAtPressure(c, T, P) - 1).toBeLessThan(1e-3);
  });
});

describe('real-gas ΔU against the reference equations of state (REFERENCES §3b, §3d, CoolProp 8.0.0)', () => {
  // Isothermal 300 K, 5 bar → 1 bar: real ΔU is 22.951 J/mol (N2) and 114.78 J/mol (CO2), ideal 0.
  // Second-virial truncation and the correlation together stay within 3 % here.
  it.each([['N2', 22.951], ['CO2', 114.78]] as const)('%s isothermal 5 → 1 bar: %s J/mol', (species, dU) => {
    const c = criticalConstants(species)!;
    const got = departureAtPressure(c, 300, 1e5) - departureAtPressure(c, 300, 5e5);
    expect(Math.abs(got / dU - 1)).toBeLessThan(0.03);
  });
  // (300 K, 5 bar) → (350 K, 1 bar): real 1065.5 (N2), 1623.1 (CO2); ideal 1041.4, 1500.7 J/mol.
  it.each([['N2', 1065.5 - 1041.4], ['CO2', 1623.1 - 1500.7]] as const)('%s (300 K, 5 bar) → (350 K, 1 bar): departure %s J/mol', (species, dep) => {
    const c = criticalConstants(species)!;
    const got = departureAtPressure(c, 350, 1e5) - departureAtPressure(c, 300, 5e5);
    expect(Math.abs(got / dep - 1)).toBeLessThan(0.05);
  });
});

/** A CO2 isothermal expansion at 300 K from 5 to 1 bar, 1 mol, heat as measured by a power meter. */
function co2Isotherm(realGas?: boolean): RunDocument {
  const N = 41, T = 300, n = 1, V1 = (n * R_GAS * T) / 5e5, V2 = (n * R_GAS * T) / 1e5;
  const V = Array.from({ length: N }, (_, i) => V1 * (V2 / V1) ** (i / (N - 1)));
  return {
    format: 'qwell.run', version: 1, runDate: '2026-03-14', process: { claimed: 'isothermal' },
    gas: { model: 'species', species: 'CO2', ...(realGas === undefined ? {} : { realGas }) },
    amount: { from: 'moles', value: n, u: 0.001 },
    ambient: {}, apparatus: {},
    instruments: [{ id: 'P', percentOfReading: 0.05 }, { id: 'V', percentOfReading: 0.05 }, { id: 'T', calibration: { U: 0.02, k: 2 } }, { id: 'W', percentOfReading: 0.5 }],
    readings: {
      time: { unit: 's', values: V.map((_, i) => i) },
      pressure: { unit: 'Pa', reference: 'absolute', instrument: 'P', values: V.map((v) => (n * R_GAS * T) / v) },
      volume: { unit: 'm3', instrument: 'V', values: V },
      temperature: { unit: 'K', instrument: 'T', values: V.map(() => T) },
      power: { unit: 'W', instrument: 'W', values: V.map(() => 100) },
    },
  };
}

describe('the departure in the balance', () => {
  it('is on by default for a species gas, shown beside the ideal ΔU, with its own budget row', () => {
    const res = checkRunDocument(co2Isotherm(), { draws: 0 });
    if (!res.ok) throw new Error(JSON.stringify(res.errors));
    const e = res.result.internalEnergy;
    expect(e.ideal).toBe(0);
    // 1 mol from 5 to 1 bar: about +113 J (REFERENCES §3d, real 114.78 J/mol; within 3 %)
    expect(Math.abs(e.departure / 114.78 - 1)).toBeLessThan(0.03);
    expect(e.value).toBeCloseTo(e.ideal + e.departure, 12);
    const row = res.result.budget.find((b) => b.group === 'real-gas departure')!;
    expect(row.u).toBe(0.1);
    expect(row.sensitivities.dU).toBeCloseTo(e.departure, 6);
  });
  it('realGas: false keeps the ideal gas', () => {
    const res = checkRunDocument(co2Isotherm(false), { draws: 0 });
    if (!res.ok) throw new Error(JSON.stringify(res.errors));
    expect(res.result.internalEnergy.departure).toBe(0);
    expect(res.result.budget.some((b) => b.group === 'real-gas departure')).toBe(false);
  });
});
