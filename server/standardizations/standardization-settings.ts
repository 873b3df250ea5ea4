import { ASTM_D240_MIN_DAYS, ASTM_D240_MIN_RUNS, type AcceptanceRule } from '../engine/control-chart';

/**
 * The lab's acceptance rule for a standardization series: QWELL_STANDARDIZATION_MIN_RUNS (default 6) and
 * QWELL_STANDARDIZATION_MIN_DAYS (default 3), the published ASTM D240 §8.1 rule, and
 * QWELL_STANDARDIZATION_MAX_RSD, the largest relative standard deviation in percent (default 0.5, a lab choice).
 */
export function acceptanceRuleFromEnv(env: NodeJS.ProcessEnv = process.env): AcceptanceRule {
  const num = (name: string, fallback: number, integer: boolean) => {
    const raw = env[name];
    const v = raw === undefined || raw === '' ? fallback : Number(raw);
    if (!Number.isFinite(v) || v <= 0 || (integer && !Number.isInteger(v))) throw new Error(`${name} must be a positive ${integer ? 'whole ' : ''}number, got "${raw}"`);
    return v;
  };
  return {
    minRuns: num('QWELL_STANDARDIZATION_MIN_RUNS', ASTM_D240_MIN_RUNS, true),
    minDays: num('QWELL_STANDARDIZATION_MIN_DAYS', ASTM_D240_MIN_DAYS, true),
    maxRsd: num('QWELL_STANDARDIZATION_MAX_RSD', 0.5, false) / 100,
  };
}

/**
 * QWELL_USE_FITTED_HEAT_LOSS: "1" (or "on", "true") makes runs pinned to a standardization use its mean fitted
 * heat-loss coefficient h and u(h) instead of the h typed in the register; "0", "off", "false" or unset: off
 * (the default, so that an h the lab measured another way is not replaced without a decision).
 */
export function useFittedHeatLossFromEnv(env: NodeJS.ProcessEnv = process.env): boolean {
  const raw = (env['QWELL_USE_FITTED_HEAT_LOSS'] ?? '').trim().toLowerCase();
  if (['', '0', 'off', 'false'].includes(raw)) return false;
  if (['1', 'on', 'true'].includes(raw)) return true;
  throw new Error(`QWELL_USE_FITTED_HEAT_LOSS must be 1 or 0 (on or off), got "${env['QWELL_USE_FITTED_HEAT_LOSS']}"`);
}
