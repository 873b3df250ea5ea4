import { BalanceResult } from '../run-detail.models';
import { claimedCurve, gammaFor, idealCurve, PvPoint } from './pv-curves';

// A path of three readings: 2.0 L → 3.0 L, 100 kPa falling.
const path: PvPoint[] = [
  { x: 2, y: 100 },
  { x: 2.5, y: 78 },
  { x: 3, y: 62 },
];

const result = (over: Partial<BalanceResult>): BalanceResult =>
  ({ process: { claimed: 'adiabatic', index: null }, gas: 'CO2 (NASA Glenn)', polytropicFit: null, ...over }) as BalanceResult;

describe('gammaFor: the gas\'s own γ', () => {
  it('takes the engine\'s γ for CO₂ from the result, not 1.4', () => {
    // REFERENCES §2b: γ of CO₂ at 298.15 K is 1.28854 (NASA Glenn polynomials); the engine gives it at the run's T.
    const choice = gammaFor({ gas: { model: 'species', species: 'CO2' } }, result({ gamma: 1.2885 }));
    expect(choice?.gamma).toBeCloseTo(1.2885, 4);
    expect(choice?.source).toContain('CO2');
  });
  it('falls back to the species\' γ at 298.15 K for a result stored without one', () => {
    // REFERENCES §2b: CO₂ 1.28854, N₂ 1.39955; 5/3 for a monatomic ideal gas (kinetic theory, common practice).
    expect(gammaFor({ gas: { model: 'species', species: 'CO2' } }, null)?.gamma).toBeCloseTo(1.28854, 5);
    expect(gammaFor({ gas: { model: 'species', species: 'N2' } }, null)?.gamma).toBeCloseTo(1.39955, 5);
    expect(gammaFor({ gas: { model: 'species', species: 'Ar' } }, null)?.gamma).toBeCloseTo(5 / 3, 12);
    expect(gammaFor({ gas: { model: 'equipartition', f: 6 } }, null)?.gamma).toBeCloseTo(4 / 3, 12);
  });
  it('has no γ for a calorimeter without a gas model, rather than a guessed 1.4', () => {
    expect(gammaFor({ gas: { model: 'calorimeter' } }, null)).toBeNull();
  });
});

describe('claimedCurve: the claimed process through the first reading', () => {
  const co2 = { gamma: 1.28854, source: 'CO2' };
  it('isobar: P stays at P₁ over the volume span', () => {
    const curve = claimedCurve('isobaric', path, co2, null, null)!;
    expect(curve.label).toMatch(/isobar/);
    expect(curve.points).toEqual([{ x: 2, y: 100 }, { x: 3, y: 100 }]);
  });
  it('isochore: a vertical line at V₁ over the pressure span', () => {
    const still: PvPoint[] = [{ x: 2, y: 100 }, { x: 2, y: 120 }, { x: 2, y: 140 }];
    const curve = claimedCurve('isochoric', still, co2, null, null)!;
    expect(curve.label).toMatch(/isochore/);
    expect(curve.points).toEqual([{ x: 2, y: 100 }, { x: 2, y: 140 }]);
  });
  it('isotherm: P·V = P₁·V₁ (Boyle\'s law, common practice)', () => {
    const end = claimedCurve('isothermal', path, co2, null, null)!.points.at(-1)!;
    expect(end.x).toBe(3);
    expect(end.y).toBeCloseTo((100 * 2) / 3, 10);
  });
  it('adiabat with CO₂\'s γ: P₂ = P₁·(V₁/V₂)^γ, not with 1.4', () => {
    // Reversible adiabat of an ideal gas, P·V^γ = const (common practice); γ(CO₂) from REFERENCES §2b.
    const curve = claimedCurve('adiabatic', path, co2, null, null)!;
    const end = curve.points.at(-1)!;
    expect(end.y).toBeCloseTo(100 * (2 / 3) ** 1.28854, 8);
    expect(Math.abs(end.y - 100 * (2 / 3) ** 1.4)).toBeGreaterThan(1);
    expect(curve.label).toContain('γ = 1.289');
  });
  it('polytrope: the claimed index, else the fitted one', () => {
    const claimed = claimedCurve('polytropic', path, co2, 1.2, 1.1)!;
    expect(claimed.points.at(-1)!.y).toBeCloseTo(100 * (2 / 3) ** 1.2, 8);
    expect(claimed.label).toContain('claimed n = 1.200');
    const fitted = claimedCurve('polytropic', path, co2, null, 1.1)!;
    expect(fitted.points.at(-1)!.y).toBeCloseTo(100 * (2 / 3) ** 1.1, 8);
    expect(fitted.label).toContain('fitted n = 1.100');
  });
  it('no curve for a free-form path, nor an adiabat without a gas', () => {
    expect(claimedCurve('free-form', path, co2, null, null)).toBeNull();
    expect(claimedCurve('adiabatic', path, null, null, null)).toBeNull();
  });
  it('idealCurve keeps P·Vⁿ constant', () => {
    for (const p of idealCurve(path[0], 2, 3, 1.3, 4)) {
      expect(p.y * p.x ** 1.3).toBeCloseTo(100 * 2 ** 1.3, 8);
    }
  });
});
