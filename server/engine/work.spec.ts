import fc from 'fast-check';
import { amountFromMass, amountFromState } from './amount';
import { electricalHeat, heatLeak, netHeat, trapezoidIntegral, trapezoidWeights } from './heat';
import { R_GAS } from './units';
import { modelWork, shoelaceArea, trapezoidWork } from './work';

// REFERENCES §6 case: n = 0.0400 mol, T1 = 300 K, V 1.00 L → 2.00 L on numpy.linspace grids.
const n = 0.04, T1 = 300, V1 = 1e-3, V2 = 2e-3;
const P1 = (n * R_GAS * T1) / V1;
const linspace = (a: number, b: number, N: number) => Array.from({ length: N }, (_, i) => a + ((b - a) * i) / (N - 1));
const isothermPath = (N: number) => {
  const V = linspace(V1, V2, N);
  return { V, P: V.map((v) => (P1 * V1) / v) };
};
const adiabatPath = (N: number, g: number) => {
  const V = linspace(V1, V2, N);
  return { V, P: V.map((v) => P1 * (V1 / v) ** g) };
};

describe('trapezoidal ∫P dV against REFERENCES §6 (computed)', () => {
  it('initial pressure P1 = nRT/V1 = 99 773.551 Pa', () => {
    expect(P1).toBeCloseTo(99773.551, 3);
  });
  it('isothermal: analytic 69.157 755 86 J, 11 points 69.220 036 77 J, 101 points 69.158 379 44 J', () => {
    expect(modelWork({ process: 'isothermal', P1, V1, P2: 0, V2, Pmean: 0, n, T1 }).value).toBeCloseTo(69.15775586, 7);
    const w11 = trapezoidWork(isothermPath(11).P, isothermPath(11).V);
    const w101 = trapezoidWork(isothermPath(101).P, isothermPath(101).V);
    expect(w11).toBeCloseTo(69.22003677, 7);
    expect(w101).toBeCloseTo(69.15837944, 7);
    // O(h²): the error ratio between h = 0.1 L and 0.01 L is 99.88 (REFERENCES §6)
    expect((w11 - 69.15775586) / (w101 - 69.15775586)).toBeCloseTo(99.88, 1);
    // leading Euler–Maclaurin term h²/12·nRT(1/V1² − 1/V2²) = 0.062 358 J; actual error 0.062 281 J (REFERENCES §6)
    expect(w11 - 69.15775586).toBeCloseTo(0.062281, 5);
  });
  it('adiabatic γ = 1.4: analytic 60.398 347 57 J, 11 points 60.492 545 96 J, 101 points 60.399 291 03 J', () => {
    const p11 = adiabatPath(11, 1.4), p101 = adiabatPath(101, 1.4);
    const P2 = p11.P[10];
    expect(P2).toBeCloseTo(37807.106, 3); // REFERENCES §6 companion value
    expect(modelWork({ process: 'adiabatic', P1, V1, P2, V2, Pmean: 0, n, T1, gamma: 1.4 }).value).toBeCloseTo(60.39834757, 7);
    expect(trapezoidWork(p11.P, p11.V)).toBeCloseTo(60.49254596, 7);
    expect(trapezoidWork(p101.P, p101.V)).toBeCloseTo(60.39929103, 7);
    expect((trapezoidWork(p11.P, p11.V) - 60.39834757) / (trapezoidWork(p101.P, p101.V) - 60.39834757)).toBeCloseTo(99.84, 1);
  });
  it('adiabatic γ = 1.399 535 463 (N2 Shomate at 300 K): analytic 60.407 623 68 J, 11 points 60.501 783 77 J', () => {
    const g = 1.399535463;
    const p11 = adiabatPath(11, g);
    expect(p11.P[10]).toBeCloseTo(37819.282, 2);
    expect(modelWork({ process: 'adiabatic', P1, V1, P2: p11.P[10], V2, Pmean: 0, n, T1, gamma: g }).value).toBeCloseTo(60.40762368, 6);
    expect(trapezoidWork(p11.P, p11.V)).toBeCloseTo(60.50178377, 6);
    expect(trapezoidWork(adiabatPath(101, g).P, adiabatPath(101, g).V)).toBeCloseTo(60.40856676, 6);
  });
  it('adiabatic γ = 1.4 end state: T2 = 227.357 48 K and n·Cv·ΔT = −W (REFERENCES §6)', () => {
    const P2 = P1 * (V1 / V2) ** 1.4;
    const T2 = (P2 * V2) / (n * R_GAS);
    expect(T2).toBeCloseTo(227.35748, 4);
    expect(n * 2.5 * R_GAS * (T2 - T1)).toBeCloseTo(-60.39834757, 6); // Cv = R/(γ − 1) = 5R/2
  });
});

describe('model work for the other claimed processes (standard ideal-gas results, common practice)', () => {
  it('isobaric P·ΔV, isochoric 0, polytropic (P1V1 − P2V2)/(n − 1) and its n = 1 limit', () => {
    expect(modelWork({ process: 'isobaric', P1, V1, P2: P1, V2, Pmean: 2e5, n, T1 }).value).toBeCloseTo(200, 10);
    expect(modelWork({ process: 'isochoric', P1, V1, P2: P1, V2: V1, Pmean: P1, n, T1 }).value).toBe(0);
    const P2 = P1 * (V1 / V2) ** 1.2;
    expect(modelWork({ process: 'polytropic', P1, V1, P2, V2, Pmean: 0, n, T1, index: 1.2 }).value).toBeCloseTo((P1 * V1 - P2 * V2) / 0.2, 10);
    expect(modelWork({ process: 'polytropic', P1, V1, P2: P1 / 2, V2, Pmean: 0, n, T1, index: 1 }).value).toBeCloseTo(69.15775586, 7);
    expect(modelWork({ process: 'calorimetric', P1, V1, P2, V2, Pmean: 0, n, T1 }).value).toBeNull();
  });
});

describe('properties of the trapezoidal work', () => {
  const path = fc.array(fc.tuple(fc.double({ min: 1e3, max: 1e6, noNaN: true }), fc.double({ min: 1e-4, max: 1e-2, noNaN: true })), { minLength: 2, maxLength: 60 });
  it('reversing the path reverses the sign of W', () => {
    fc.assert(fc.property(path, (pts) => {
      const P = pts.map((p) => p[0]), V = pts.map((p) => p[1]);
      const w = trapezoidWork(P, V);
      const back = trapezoidWork([...P].reverse(), [...V].reverse());
      expect(Math.abs(w + back)).toBeLessThanOrEqual(1e-9 * (Math.abs(w) + 1));
    }));
  });
  it("a closed cycle's W equals the enclosed area (shoelace formula)", () => {
    fc.assert(fc.property(path, (pts) => {
      const P = pts.map((p) => p[0]), V = pts.map((p) => p[1]);
      const closedP = [...P, P[0]], closedV = [...V, V[0]];
      const w = trapezoidWork(closedP, closedV);
      expect(Math.abs(w - shoelaceArea(P, V))).toBeLessThanOrEqual(1e-9 * (Math.abs(w) + 1));
    }));
  });
  it('a rectangle cycle traversed clockwise in P–V does positive work (P_high − P_low)·ΔV', () => {
    expect(trapezoidWork([2e5, 2e5, 1e5, 1e5, 2e5], [1e-3, 2e-3, 2e-3, 1e-3, 1e-3])).toBeCloseTo(100, 10);
  });
});

describe('heat and amount', () => {
  it('trapezoid weights reproduce the trapezoid integral', () => {
    const t = [0, 1, 3, 4.5, 7];
    const f = [2, 3, 5, 4, 1];
    const w = trapezoidWeights(t);
    expect(w.reduce((s, wi, i) => s + wi * f[i], 0)).toBeCloseTo(trapezoidIntegral(t, f), 12);
    expect(trapezoidIntegral(t, f)).toBeCloseTo(0.5 * (5 * 1 + 8 * 2 + 9 * 1.5 + 5 * 2.5), 12);
  });
  it('Joule heat ∫U·I dt of 12 V × 1.5 A for 300 s is 5400 J; Newtonian leak h·ΔT·t', () => {
    // Joule's law P = U·I and Newton's law of cooling, common practice
    const t = linspace(0, 300, 31);
    expect(electricalHeat(t, t.map(() => 12), t.map(() => 1.5))).toBeCloseTo(5400, 9);
    expect(heatLeak(t, t.map(() => 301), 0.08, 300)).toBeCloseTo(24, 9);
    expect(netHeat(5400, 24, 6)).toBe(5370);
  });
  it('n = m/M and n = P1V1/(ZRT1)', () => {
    // ideal-gas law PV = nRT, with Z from REFERENCES §3a (N2, 300 K, 20 bar: Z = 0.99725)
    expect(amountFromMass(1.12054e-3, 28.0134e-3)).toBeCloseTo(0.04, 6);
    expect(amountFromState(P1, V1, T1)).toBeCloseTo(0.04, 12);
    const ideal = amountFromState(20e5, 1e-3, 300);
    expect(amountFromState(20e5, 1e-3, 300, 0.99725) / ideal).toBeCloseTo(1 / 0.99725, 12);
  });
});
