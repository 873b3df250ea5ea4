import type { BalanceSettings } from '../engine';

/** The lab's engine settings (DESIGN §2): k = 2, 10⁵ Monte Carlo draws, indeterminate above 20 %. */
export function balanceSettingsFromEnv(): Required<Omit<BalanceSettings, 'seed'>> {
  const num = (name: string, fallback: number) => {
    const raw = process.env[name];
    const v = raw === undefined || raw === '' ? fallback : Number(raw);
    if (!Number.isFinite(v) || v < 0) throw new Error(`${name} must be a non-negative number, got "${raw}"`);
    return v;
  };
  return {
    coverageFactor: num('QWELL_COVERAGE_FACTOR', 2),
    draws: Math.round(num('QWELL_MC_DRAWS', 100_000)),
    indeterminateFraction: num('QWELL_INDETERMINATE_FRACTION', 0.2),
  };
}
