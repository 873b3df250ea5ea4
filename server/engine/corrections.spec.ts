// Certificate corrections applied to the readings (corrections.ts). GUM (JCGM 100:2008) §3.2.3: a result is
// corrected for every recognised significant systematic effect; §3.2.4: the correction's own uncertainty is what
// the certificate's U states. The checks below correct the readings by hand, in the test, from the
// certificate's values (reading × gain + offset), never through the engine's own helper.
import { checkRunDocument, type BalanceResult } from './balance';
import type { RunDocument } from './run-document';
import { checkedResult, loadFixture } from '../../testing/fixture-runs';

const load = (name: string): RunDocument => loadFixture(name.replace(/\.json$/, ''));
const run = checkedResult;
const errorsOf = (doc: unknown) => {
  const res = checkRunDocument(doc, { draws: 0 });
  return res.ok ? [] : res.errors;
};

/** The document with the thermometer's certificate stating a correction (channel TC's entry of `instruments`). */
function withThermometerCorrection(doc: RunDocument, correction: Record<string, unknown>, dates: { calibrationDate?: string; dueDate?: string } = {}): RunDocument {
  const copy: RunDocument = structuredClone(doc);
  const id = copy.readings.temperature.instrument!;
  const inst = copy.instruments.find((i) => i.id === id)!;
  inst.calibration = { ...inst.calibration!, correction };
  Object.assign(inst, dates);
  return copy;
}

/** The same run with its temperature readings corrected by hand and no correction stated. */
function correctedByHand(doc: RunDocument, correct: (reading: number) => number): RunDocument {
  const copy: RunDocument = structuredClone(doc);
  copy.readings.temperature.values = copy.readings.temperature.values.map(correct);
  return copy;
}

/** The numbers a verdict rests on. */
const figures = (r: BalanceResult) => ({
  W: r.work.measured, uW: r.work.u, Q: r.heat.total, leak: r.heat.leak, uQ: r.heat.u, dU: r.internalEnergy.value, udU: r.internalEnergy.u,
  r: r.residual.r, Ur: r.residual.U, En: r.En, verdict: r.verdict, T1: r.temperatures.T1, T2: r.temperatures.T2, n: r.amount.n,
  rise: r.temperatureRise?.corrected ?? null, mcMean: r.monteCarlo?.mean ?? null, budget: r.budget.map((b) => [b.source, b.u, b.contribution]),
});

describe('a certificate\'s correction is applied to its instrument\'s readings (GUM §3.2.3)', () => {
  // Invented certificate values (demo data): gain 1.0004, offset −0.05 °C, as a thermometer certificate may state them.
  const gain = 1.0004;
  const offset = -0.05;

  it('gives exactly the ΔU, Q, W, U(r), En and verdict of the same run corrected by hand (calorimeter, °C)', () => {
    const doc = load('calorimetric.json');
    const stated = run(withThermometerCorrection(doc, { certificate: 'HIAT-CAL-2310', gain, offset, unit: 'degC' }));
    const byHand = run(correctedByHand(doc, (t) => t * gain + offset));
    expect(figures(stated)).toEqual(figures(byHand));
    // …and the correction changed the result: ΔU = C·ΔT scales with the gain (C from the fixture, 4.5 kJ/K).
    const raw = run(doc);
    expect(stated.internalEnergy.value).not.toBe(raw.internalEnergy.value);
    expect(stated.temperatures.T2 - stated.temperatures.T1).toBeCloseTo(gain * (raw.temperatures.T2 - raw.temperatures.T1), 10);
  });

  it('records what it applied, in the certificate\'s own words and unit; the hand-corrected run records nothing', () => {
    const doc = load('calorimetric.json');
    const stated = run(withThermometerCorrection(doc, { certificate: 'HIAT-CAL-2310', gain, offset, unit: 'degC' }));
    expect(stated.corrections).toEqual([
      { reading: 'temperature', instrument: 'TC-9', instrumentName: 'Pt100 probe, bath calorimeter', certificate: 'HIAT-CAL-2310', gain, offset, unit: 'degC' },
    ]);
    expect(run(correctedByHand(doc, (t) => t * gain + offset)).corrections).toEqual([]);
    expect(run(doc).corrections).toEqual([]);
  });

  it('leaves the readings of the document as entered', () => {
    const doc = withThermometerCorrection(load('calorimetric.json'), { gain, offset });
    const before = [...doc.readings.temperature.values];
    run(doc);
    expect(doc.readings.temperature.values).toEqual(before);
  });

  it('an offset cancels in a temperature rise but not in the heat leak, which reads T − T_ambient', () => {
    const doc = load('calorimetric.json');
    const raw = run(doc);
    const shifted = run(withThermometerCorrection(doc, { offset: 0.5, unit: 'degC' }));
    // ΔT and so ΔU = C·ΔT do not move (a common offset cancels in a difference, GUM 5.2.4: the readings' shared
    // offset is fully correlated); the corrected rise (Regnault–Pfaundler) reads only differences too.
    expect(shifted.internalEnergy.value).toBeCloseTo(raw.internalEnergy.value, 9);
    expect(shifted.temperatureRise!.corrected.value).toBeCloseTo(raw.temperatureRise!.corrected.value, 12);
    // Newton's law of cooling: leak = ∫h·(T − T_a) dt moves by h·offset·duration = 0.08 W/K × 0.5 K × 600 s = 24 J
    // (h and the 600 s record from the fixture).
    expect(shifted.heat.leak - raw.heat.leak).toBeCloseTo(0.08 * 0.5 * 600, 9);
  });

  it('an offset moves an absolute temperature: n = P₁V₁/(Z·R·T₁) of the ideal-gas initial state scales by T₁/(T₁ + offset)', () => {
    const doc = load('isothermal.json'); // N₂, n from the initial state, thermometer in °C, first reading 26.85 °C
    const raw = run(doc);
    const shifted = run(withThermometerCorrection(doc, { offset: 0.5, unit: 'degC' }));
    // Ideal-gas law: n ∝ 1/T₁, T₁ = 26.85 °C + 273.15 = 300 K (ITS-90 / SI Brochure: T/K = t/°C + 273.15).
    expect(shifted.temperatures.T1).toBeCloseTo(300.5, 10);
    expect(shifted.amount.n! / raw.amount.n!).toBeCloseTo(300 / 300.5, 12);
    expect(figures(shifted)).toEqual(figures(run(correctedByHand(doc, (t) => t + 0.5))));
  });

  it('an offset moves the heat-capacity lookup: n·∫Cv dT over the shifted span, checked against the NIST Shomate fit of CO₂', () => {
    const doc = load('polytropic.json'); // CO₂, n from the mass, thermometer in K
    const raw = run(doc);
    const o = 0.5;
    const shifted = run(withThermometerCorrection(doc, { offset: o }));
    // NIST Chemistry WebBook (SRD 69) Shomate coefficients of CO₂, 298–1200 K (REFERENCES §2a):
    // H°(T) − H°(298.15) = A·t + B·t²/2 + C·t³/3 + D·t⁴/4 − E/t + F − H, t = T/1000, kJ/mol.
    const [A, B, C, D, E] = [24.99735, 55.18696, -33.69137, 7.948387, -0.136638];
    const H = (T: number) => { const t = T / 1000; return 1000 * (A * t + (B * t * t) / 2 + (C * t ** 3) / 3 + (D * t ** 4) / 4 - E / t); };
    const { T1, T2 } = raw.temperatures;
    const n = raw.amount.n!;
    // Cv = Cp − R: the R·ΔT parts are equal (ΔT does not change) and cancel in the difference.
    const expected = n * (H(T2 + o) - H(T1 + o) - (H(T2) - H(T1)));
    const moved = shifted.internalEnergy.ideal - raw.internalEnergy.ideal;
    expect(expected).toBeGreaterThan(0.03); // Cp of CO₂ rises by about 1.6 J/(mol·K) from 300 K to 345 K
    // The engine reads the NASA Glenn polynomials, not the Shomate fit: they agree to ~0.01 J/(mol·K) (REFERENCES §2a).
    expect(Math.abs(moved - expected)).toBeLessThan(0.05 * expected);
    expect(shifted.amount.n).toBe(n);
  });

  it('a gain of 1 with an offset of 0 changes nothing and records nothing', () => {
    const doc = load('polytropic.json');
    const identity = run(withThermometerCorrection(doc, { certificate: 'HIAT-CAL-2150', gain: 1, offset: 0 }));
    expect(figures(identity)).toEqual(figures(run(doc)));
    expect(identity.corrections).toEqual([]);
  });

  it('a certificate not in force on the run date is not applied, and the flag says so', () => {
    const doc = load('calorimetric.json'); // run date 2026-03-14
    const raw = run(doc);
    const expired = run(withThermometerCorrection(doc, { certificate: 'HIAT-CAL-1990', gain, offset }, { calibrationDate: '2025-01-10', dueDate: '2026-01-10' }));
    const later = run(withThermometerCorrection(doc, { certificate: 'HIAT-CAL-2410', gain, offset }, { calibrationDate: '2026-04-01', dueDate: '2027-04-01' }));
    for (const r of [expired, later]) {
      expect(r.corrections).toEqual([]);
      expect({ ...figures(r), mcMean: null }).toEqual({ ...figures(raw), mcMean: null });
      const flag = r.flags.find((f) => f.code === 'OUT_OF_CALIBRATION')!;
      expect(flag.message).toContain('Its certificate\'s correction (× 1.0004 − 0.05 °C) is not applied.');
    }
    // On the day it falls due the certificate is still in force (due date inclusive, as OUT_OF_CALIBRATION reads it).
    const dueToday = run(withThermometerCorrection(doc, { gain, offset, unit: 'degC' }, { calibrationDate: '2025-03-14', dueDate: '2026-03-14' }));
    expect(dueToday.corrections).toHaveLength(1);
  });

  it('a correction stated in °C is applied to readings entered in °F (t/°F = 1.8·t/°C + 32, SI Brochure / NIST SP 811 B.8)', () => {
    const doc = load('isochoric.json'); // thermometer TC-7 read in °F
    const stated = run(withThermometerCorrection(doc, { certificate: 'HIAT-CAL-2150', gain, offset, unit: 'degC' }));
    const byHand = run(correctedByHand(doc, (f) => ((f - 32) / 1.8 * gain + offset) * 1.8 + 32));
    for (const key of ['W', 'Q', 'dU', 'r', 'Ur', 'T1', 'T2'] as const) {
      expect(figures(stated)[key]).toBeCloseTo(figures(byHand)[key] as number, 9);
    }
    expect(stated.verdict).toBe(byHand.verdict);
    expect(stated.corrections[0]).toMatchObject({ gain, offset, unit: 'degC' });
  });

  it('corrects a barometer\'s reading, which makes a gauge pressure absolute (P_abs = P_gauge + P_baro, common practice)', () => {
    const doc = load('isothermal.json');
    doc.instruments.push({ id: 'BA-1', name: 'Barometer', calibration: { U: 0.03, k: 2, correction: { certificate: 'HIAT-CAL-2204', offset: 0.12, unit: 'kPa' } } });
    doc.ambient.pressure = { ...doc.ambient.pressure!, instrument: 'BA-1' };
    const r = run(doc, 0);
    expect(r.corrections).toEqual([{ reading: 'ambientPressure', instrument: 'BA-1', instrumentName: 'Barometer', certificate: 'HIAT-CAL-2204', gain: 1, offset: 0.12, unit: 'kPa' }]);
  });

  it('refuses a correction it cannot read, saying where', () => {
    const doc = load('calorimetric.json');
    expect(errorsOf(withThermometerCorrection(doc, { gain: 0 }))).toEqual([{ path: 'instruments[0].calibration.correction.gain', message: 'must be a number greater than 0, got 0' }]);
    expect(errorsOf(withThermometerCorrection(doc, { offset: 'a' }))).toEqual([{ path: 'instruments[0].calibration.correction.offset', message: 'must be a finite number, got "a"' }]);
    expect(errorsOf(withThermometerCorrection(doc, { offset: 1, unit: 'kPa' })).map((e) => e.path)).toEqual(['instruments[0].calibration.correction.unit']);
    expect(errorsOf(withThermometerCorrection(doc, { offset: 1, scale: 2 })).map((e) => e.path)).toEqual(['instruments[0].calibration.correction']);
  });
});
