import { energyEquivalent, referenceMaterialHeat } from './energy-equivalent';
import { checkRunDocument } from './balance';

describe('energy equivalent from a reference material', () => {
  // NIST SRM 39j benzoic acid: certified massic energy 26 434 J/g ± 3 J/g (certificate; REFERENCES §4).
  const srm39j = { kind: 'reference-material' as const, material: 'benzoic acid, NIST SRM 39j', mass: { value: 1.0, unit: 'g', u: 0 }, massicEnergy: { value: 26_434, unit: 'J/g', U: 3, k: 2 } };

  it('takes Q = m × 26 434 J/g and u(q) = U/k from the certificate', () => {
    const q = referenceMaterialHeat(srm39j);
    expect(q.value).toBe(26_434); // 1.0000 g × 26 434 J/g (SRM 39j certificate)
    expect(q.u).toBeCloseTo(1.5, 12); // ±3 J/g read as expanded, k = 2 (an assumption, REFERENCES §4)
  });

  it('reproduces the synthetic SRM 39j example: ε = 10 573.6 J/K, u(ε) ≈ 4.3 J/K', () => {
    // REFERENCES §4 synthetic example: ε = 26 434 J/g × 1.0000 g / 2.5000 K. Its u(ε) = 4.3 J/K is reproduced with
    // u(m) = 0 and u(ΔT) = 1 mK (our reading of its inputs, which the reference does not state).
    const e = energyEquivalent(referenceMaterialHeat(srm39j), { value: 2.5, u: 0.001, method: 'regnault-pfaundler' });
    expect(e.value).toBeCloseTo(10_573.6, 9);
    expect(e.u).toBeCloseTo(4.3, 1);
    expect(e.budget[0].source).toBe('corrected temperature rise (regnault-pfaundler): drift fits and reading scatter');
    expect(e.budget.reduce((s, b) => s + b.share, 0)).toBeCloseTo(1, 12);
  });

  it('adds named correction energies (ASTM D240 §8.1: W = (Q·g + e₁ + e₂)/t)', () => {
    const q = referenceMaterialHeat({ ...srm39j, mass: { value: 1002.3, unit: 'mg', u: 0.02 }, corrections: [{ name: 'ignition wire', energy: { value: 21.4, unit: 'J', u: 0.5 } }, { name: 'nitric acid', energy: { value: 41.0, unit: 'J', u: 2 } }] });
    expect(q.value).toBeCloseTo(1.0023 * 26_434 + 21.4 + 41.0, 9);
    expect(q.u).toBeCloseTo(Math.hypot(0.00002 * 26_434, 1.0023 * 1.5, 0.5, 2), 9);
  });
});

/**
 * Newton's-law record sampled every 5 s: 10 V × 2 A heater from 300 s to 600 s into C = 4000 J/K (invented demo
 * numbers), each step the exact solution of dT/dt = P/C + k(Tc − T) over 5 s (common practice).
 */
function newtonRecord() {
  const t: number[] = [], T: number[] = [], U: number[] = [], I: number[] = [];
  const C = 4000, P = 20, k = 5e-4, Tc = 22.0;
  let temp = 21.0;
  for (let s = 0; s <= 1200; s += 5) {
    t.push(s); T.push(temp);
    const on = s >= 300 && s < 600;
    U.push(on ? 10 : 0); I.push(on ? 2 : 0);
    const Teq = Tc + (on ? P / (C * k) : 0);
    temp = Teq + (temp - Teq) * Math.exp(-k * 5);
  }
  return { t, T, U, I };
}

describe('a standardization run document', () => {
  const doc = () => {
    const { t, T, U, I } = newtonRecord();
    return {
      format: 'qwell.run', version: 1, runDate: '2026-03-02', purpose: 'standardization', heatSource: { kind: 'electrical' },
      process: { claimed: 'calorimetric' }, gas: { model: 'calorimeter' }, ambient: { temperature: { value: 22, unit: 'degC', u: 0.1 } },
      apparatus: { heatCapacity: { value: 4000, unit: 'J/K', u: 40 } }, instruments: [],
      periods: { mainStart: 300, mainEnd: 600 },
      readings: { time: { unit: 's', values: t }, temperature: { unit: 'degC', values: T }, voltage: { unit: 'V', values: U }, current: { unit: 'A', values: I } },
    };
  };

  it('gives ε = ∫U·I dt / ΔT_corrected in the result', () => {
    const r = checkRunDocument(doc(), { draws: 0 });
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    const { temperatureRise, energyEquivalent: e, heatLeakFit } = r.result;
    expect(r.result.purpose).toBe('standardization');
    // ∫U·I dt by the trapezoid: 20 W on readings 300…595 s, half-steps at both edges, = 20 W × 300 s
    expect(r.result.heat.electrical).toBeCloseTo(20 * 300, 6);
    expect(e!.value).toBeCloseTo(r.result.heat.electrical / temperatureRise!.corrected.value, 9);
    expect(heatLeakFit!.k.value).toBeCloseTo(5e-4, 9);
    expect(heatLeakFit!.h!.value).toBeCloseTo(5e-4 * e!.value, 6); // h = k·C
  });

  it('refuses a standardization without a heat source, and an electrical one without heater readings', () => {
    const d = doc() as Record<string, unknown>;
    delete d['heatSource'];
    const r = checkRunDocument(d);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors).toContainEqual({ path: 'heatSource', message: expect.stringMatching(/is required for a standardization run/) });
    const d2 = doc();
    const { voltage: _v, current: _c, ...readings } = d2.readings;
    const r2 = checkRunDocument({ ...d2, readings });
    if (!r2.ok) expect(r2.errors.map((e) => e.path)).toContain('heatSource');
    else throw new Error('accepted an electrical standardization without heater readings');
  });
});

describe('the thermometer\'s gain in the energy-equivalent budget', () => {
  // The same Newton's-law standardization record as above, read by a thermometer with ± 0.05 % of reading.
  const record = newtonRecord;
  const docWith = (temperatures: number[], percentOfReading: number) => {
    const r = record();
    return {
      format: 'qwell.run', version: 1, runDate: '2026-03-02', purpose: 'standardization', heatSource: { kind: 'electrical' },
      process: { claimed: 'calorimetric' }, gas: { model: 'calorimeter' }, ambient: { temperature: { value: 22, unit: 'degC', u: 0.1 } },
      apparatus: { heatCapacity: { value: 4000, unit: 'J/K', u: 40 } },
      instruments: [{ id: 'T-9', name: 'bath thermometer', percentOfReading, resolution: 0.0001, calibration: { U: 0.02, k: 2 } }],
      periods: { mainStart: 300, mainEnd: 600 },
      readings: { time: { unit: 's', values: r.t }, temperature: { unit: 'degC', values: temperatures, instrument: 'T-9' }, voltage: { unit: 'V', values: r.U }, current: { unit: 'A', values: r.I } },
    };
  };
  const check = (doc: unknown) => {
    const r = checkRunDocument(doc, { draws: 0 });
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    return r.result;
  };

  it('is a row of its own whose sensitivity ∂ε/∂g matches a central finite difference of the whole engine', () => {
    const base = record().T;
    const res = check(docWith(base, 0.05));
    const row = res.energyEquivalent!.budget.find((b) => b.source === 'thermometer gain (T-9 bath thermometer)')!;
    expect(row).toBeDefined();
    // ± 0.05 % of reading as a rectangular bound: u(g) = 0.0005/√3 (GUM 4.3.7)
    expect(row.u).toBeCloseTo(0.0005 / Math.sqrt(3), 15);
    // A gain g reads every temperature as T·(1 + g) in the instrument's unit; finite difference with g = ±1e-6
    // (central difference, common practice).
    const g = 1e-6;
    const eps = (gain: number) => check(docWith(base.map((x) => x * (1 + gain)), 0.05)).energyEquivalent!.value;
    const fd = (eps(g) - eps(-g)) / (2 * g);
    expect(Math.abs(row.sensitivity - fd) / Math.abs(fd)).toBeLessThan(1e-4);
    expect(row.sensitivity).toBeCloseTo(-res.energyEquivalent!.value, 6);
    // Its share of u²(ε), and u(ε) as the root-sum-square of the rows (GUM 5.1.2)
    const u = Math.sqrt(res.energyEquivalent!.budget.reduce((s, b) => s + b.contribution ** 2, 0));
    expect(res.energyEquivalent!.u).toBeCloseTo(u, 9);
    expect(row.share).toBeCloseTo(row.contribution ** 2 / u ** 2, 12);
  });

  it('widens u(ΔT_c) by g·ΔT_c and leaves the drift-fit part and the value alone; a common calibration offset cancels', () => {
    const base = record().T;
    const without = check(docWith(base, 0)).temperatureRise!;
    const withGain = check(docWith(base, 0.05)).temperatureRise!;
    expect(withGain.corrected.value).toBe(without.corrected.value);
    expect(withGain.uncertainty.fit).toBe(without.uncertainty.fit);
    expect(without.uncertainty.thermometerGain).toBe(0);
    expect(withGain.uncertainty.thermometerGain).toBeCloseTo(withGain.corrected.value * 0.0005 / Math.sqrt(3), 15);
    expect(withGain.corrected.u).toBeCloseTo(Math.hypot(without.uncertainty.fit, withGain.uncertainty.thermometerGain), 15);
    // The certificate's U = 0.02 K (an offset common to every reading) does not reach the rise: an offset of 0.01 K on all
    // readings leaves ΔT_c unchanged (affine invariance of both methods).
    const shifted = check(docWith(base.map((x) => x + 0.01), 0.05)).temperatureRise!;
    expect(shifted.corrected.value).toBeCloseTo(withGain.corrected.value, 9);
  });
});
