import type { BalanceSettings } from '../engine';
import { RISE_METHODS, type RiseMethod } from '../engine/temperature-rise';

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
    riseMethod: riseMethodFromEnv(),
  };
}

/** QWELL_RISE_METHOD: the corrected-rise method calorimetric results use (default Regnault–Pfaundler). */
function riseMethodFromEnv(): RiseMethod {
  const raw = process.env['QWELL_RISE_METHOD'];
  if (raw === undefined || raw === '') return 'regnault-pfaundler';
  if (!RISE_METHODS.includes(raw as RiseMethod)) throw new Error(`QWELL_RISE_METHOD must be one of ${RISE_METHODS.join(', ')}, got "${raw}"`);
  return raw as RiseMethod;
}
