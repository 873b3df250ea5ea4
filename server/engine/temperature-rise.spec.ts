import { convergenceTemperature, fitNewton, linearDrift } from './drift-fit';
import { analyseRise, detectPeriods } from './temperature-rise';

/**
 * The exact solution of Newton's law with a heater (common practice; REFERENCES §9):
 * dT/dt = P(t)/C + u + k·(T∞ − T), P constant on [on, off], zero elsewhere. Between changes of P the solution is
 * T(t) = T_eq + (T_a − T_eq)·e^(−k(t − t_a)) with T_eq = T∞ + u/k + P/(C·k). The heat the heater gave is P·(off − on),
 * so the rise the calorimeter would have shown without exchange with its jacket is exactly P·(off − on)/C.
 */
function newtonRecord(o: { C: number; P: number; on: number; off: number; k: number; Tinf: number; u: number; T0: number; step: number; end: number }) {
  const t: number[] = [], T: number[] = [];
  const Tconv = o.Tinf + o.u / o.k;
  const at = (time: number): number => {
    const seg = (Ta: number, ta: number, tt: number, P: number) => {
      const Teq = Tconv + P / (o.C * o.k);
      return Teq + (Ta - Teq) * Math.exp(-o.k * (tt - ta));
    };
    if (time <= o.on) return seg(o.T0, 0, time, 0);
    const Ton = seg(o.T0, 0, o.on, 0);
    if (time <= o.off) return seg(Ton, o.on, time, o.P);
    const Toff = seg(Ton, o.on, o.off, o.P);
    return seg(Toff, o.off, time, 0);
  };
  for (let time = 0; time <= o.end + 1e-9; time += o.step) { t.push(time); T.push(at(time)); }
  return { t, T, exactRise: (o.P * (o.off - o.on)) / o.C, Tconv };
}

describe('corrected temperature rise against an exact Newton\'s-law solution (common practice)', () => {
  const spec = { C: 10_000, P: 50, on: 600, off: 1200, k: 1e-3, Tinf: 298.15, u: 2e-4, T0: 297.0, step: 1, end: 2400 };
  const rec = newtonRecord(spec);

  it('fits the cooling constant k and the convergence temperature T∞ + u/k to 1e-6', () => {
    const fit = fitNewton(rec.t, rec.T, 600, 1200)!;
    // exact: k = 1e-3 1/s, T∞ + u/k = 298.15 + 0.2 = 298.35 K (the record's own parameters)
    expect(Math.abs(fit.k - spec.k) / spec.k).toBeLessThan(1e-6);
    expect(Math.abs(convergenceTemperature(fit).value - rec.Tconv)).toBeLessThan(1e-6);
    expect(fit.scatter).toBeLessThan(1e-9);
  });

  it('gives the Regnault–Pfaundler corrected rise P·Δt/C = 3 K to 1e-6 K with the periods given', () => {
    const a = analyseRise(rec.t, rec.T, 'regnault-pfaundler', { mainStart: 600, mainEnd: 1200 });
    expect(rec.exactRise).toBe(3);
    expect(Math.abs(a.rise.corrected.value - rec.exactRise)).toBeLessThan(1e-6);
    expect(a.rise.method).toBe('regnault-pfaundler');
    expect(a.rise.periods).toMatchObject({ source: 'document', startReading: 601, endReading: 1201, foreReadings: 601, afterReadings: 1201 });
    // The observed rise is not the corrected one: the jacket takes heat (T is above T∞ + u/k at the end).
    expect(Math.abs(a.rise.observed - rec.exactRise)).toBeGreaterThan(0.05);
  });

  it('stays exact when the main period is taken wider than the heating (Newton\'s law holds in the outer readings)', () => {
    const a = analyseRise(rec.t, rec.T, 'regnault-pfaundler', { mainStart: 500, mainEnd: 1500 });
    expect(Math.abs(a.rise.corrected.value - rec.exactRise)).toBeLessThan(1e-6);
  });

  it('detects the heater pulse as the main period and still gives the exact rise', () => {
    const sharp = newtonRecord({ ...spec, P: 200, on: 600, off: 750, k: 2e-4, u: 0 });
    const p = detectPeriods(sharp.t, sharp.T);
    expect(p.iStart).toBeLessThanOrEqual(600);
    expect(p.iStart).toBeGreaterThan(550);
    expect(p.iEnd).toBeGreaterThanOrEqual(750);
    expect(p.iEnd).toBeLessThan(800);
    const a = analyseRise(sharp.t, sharp.T, 'regnault-pfaundler');
    expect(a.rise.periods.source).toBe('detected');
    expect(Math.abs(a.rise.corrected.value - sharp.exactRise)).toBeLessThan(1e-6);
  });

  it('refuses a record whose fore-period is too short, saying which period', () => {
    expect(() => analyseRise(rec.t, rec.T, 'regnault-pfaundler', { mainStart: 1, mainEnd: 1200 })).toThrow(/fore-period has 2 reading/);
    expect(() => analyseRise(rec.t, rec.T, 'regnault-pfaundler', { mainStart: 600, mainEnd: 2399 })).toThrow(/after-period has 2 reading/);
  });
});

describe('Dickinson\'s extrapolation (ASTM D240 form ΔT = t_c − t_a − r₁(b − a) − r₂(c − b), from memory)', () => {
  // Hand-worked record: fore drift r₁ = +0.002 K/s, after drift r₂ = −0.001 K/s, a linear rise of 2 K from a = 100 s
  // to c = 200 s. b is where 60 % of the rise is reached: 160 s. ΔT = 2 − 0.002·60 − (−0.001)·40 = 1.92 K.
  const t: number[] = [], T: number[] = [];
  for (let s = 0; s <= 300; s += 10) {
    t.push(s);
    T.push(s <= 100 ? 24.8 + 0.002 * s : s <= 200 ? 25 + 0.02 * (s - 100) : 27 - 0.001 * (s - 200));
  }
  it('extrapolates the drift lines to the 60 % time', () => {
    const a = analyseRise(t, T, 'dickinson', { mainStart: 100, mainEnd: 200 });
    expect(a.rise.method).toBe('dickinson');
    expect(a.rise.periods.dickinsonTime).toBeCloseTo(160, 9);
    expect(a.rise.corrected.value).toBeCloseTo(1.92, 9);
    expect(a.rise.alternative.method).toBe('regnault-pfaundler');
  });

  it('fits each outer drift line with its slope (least squares, common practice)', () => {
    const fore = linearDrift(t, T, 0, 10);
    expect(fore.rate).toBeCloseTo(0.002, 12);
    expect(fore.meanTemperature).toBeCloseTo(24.9, 12);
    expect(fore.uRate).toBeLessThan(1e-12);
  });
});
