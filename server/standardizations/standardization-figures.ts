import { summariseSeries, type AcceptanceRule, type SeriesSummary } from '../engine/control-chart';

export interface ChosenRun {
  runDate: string;
  energyEquivalent: { value: number; u: number };
  heatLoss: { value: number; u: number } | null;
}

export interface StandardizationFigures {
  summary: SeriesSummary;
  energyEquivalent: { value: number; u: number };
  heatLossCoefficient: { value: number; u: number } | null;
}

/**
 * The figures a standardization records from its runs (in date order): mean ε with
 * u(ε̄)² = s²/n + ū² — the scatter of the mean plus the runs' own budgets taken as fully correlated (the same
 * heater meters and thermometer in every run; GUM 5.2.2 with r = 1, a conservative choice) — and the mean fitted h.
 */
export function standardizationFigures(chosen: readonly ChosenRun[], rule: AcceptanceRule): StandardizationFigures {
  const summary = summariseSeries(chosen.map((r) => ({ date: r.runDate, value: r.energyEquivalent.value })), rule);
  const n = chosen.length;
  const uBar = chosen.reduce((a, r) => a + r.energyEquivalent.u, 0) / n;
  const s2n = n > 1 ? (summary.sd * summary.sd) / n : 0;
  const hs = chosen.flatMap((r) => (r.heatLoss ? [r.heatLoss] : []));
  let heatLossCoefficient: StandardizationFigures['heatLossCoefficient'] = null;
  if (hs.length) {
    const mean = hs.reduce((a, h) => a + h.value, 0) / hs.length;
    const u = hs.length > 1 ? Math.sqrt(hs.reduce((a, h) => a + (h.value - mean) ** 2, 0) / (hs.length - 1) / hs.length) : hs[0].u;
    heatLossCoefficient = { value: mean, u };
  }
  return { summary, energyEquivalent: { value: summary.mean, u: Math.sqrt(s2n + uBar * uBar) }, heatLossCoefficient };
}
