import type { BalanceSettings } from '../engine';
import { RISE_METHODS, type RiseMethod } from '../engine/temperature-rise';

/**
 * The lab's engine settings (DESIGN §2), from the environment: k = 2, 10⁵ Monte Carlo draws, indeterminate above
 * 20 %, and the flag thresholds (docs/run-document.md "Settings"): a drift, index or heater spread is flagged when
 * it exceeds 3 propagated standard uncertainties plus what the claim allows.
 */
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
    flagCoverage: num('QWELL_FLAG_COVERAGE', 3),
    isothermalDriftFraction: num('QWELL_ISOTHERMAL_DRIFT_FRACTION', 0.01),
    isochoricVolumeFraction: num('QWELL_ISOCHORIC_VOLUME_FRACTION', 0.005),
    adiabaticHeatFraction: num('QWELL_ADIABATIC_HEAT_FRACTION', 0.01),
    indexTolerance: num('QWELL_INDEX_TOLERANCE', 0.05),
    heaterResistanceTolerance: num('QWELL_HEATER_RESISTANCE_TOLERANCE', 0.02),
  };
}

/** QWELL_RISE_METHOD: the corrected-rise method calorimetric results use (default Regnault–Pfaundler). */
function riseMethodFromEnv(): RiseMethod {
  const raw = process.env['QWELL_RISE_METHOD'];
  if (raw === undefined || raw === '') return 'regnault-pfaundler';
  if (!RISE_METHODS.includes(raw as RiseMethod)) throw new Error(`QWELL_RISE_METHOD must be one of ${RISE_METHODS.join(', ')}, got "${raw}"`);
  return raw as RiseMethod;
}
