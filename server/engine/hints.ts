// Diagnostic hints: for a run that breaks, common recording mistakes that would make it close; for an
// indeterminate run, the source that dominates u(r) and what halving it would buy.
import type { RunDocument } from './run-document';
import type { Verdict } from './verdict';

export type HintCode =
  | 'GAUGE_AS_ABSOLUTE'
  | 'ML_AS_L'
  | 'CELSIUS_AS_KELVIN'
  | 'TEMPERATURE_OFFSET'
  | 'CURRENT_UNIT'
  | 'HEATER_CHANNEL_MISSING'
  | 'FORGOTTEN_HEAT_LEAK'
  | 'DOMINANT_SOURCE'
  | 'HEATER_CHANNEL_SUSPECT';

export interface Hint {
  code: HintCode;
  message: string;
  /** En and residual r (J) of the run with the alteration applied, when one was tried. */
  alteredEn?: number;
  alteredResidual?: number;
  /** The fitted quantity of a hint that solves for one (offset in K, h in W/K, heater energy in J, U(r) in J). */
  value?: number;
}

export interface Outcome {
  r: number;
  Ur: number;
  En: number;
  verdict: Verdict;
}

/** Evaluates an altered document without Monte Carlo or hints; null when it cannot be evaluated. */
export type Evaluator = (doc: RunDocument) => Outcome | null;

/** A temperature offset larger than this is not a plausible sensor error and is not offered. */
export const MAX_PLAUSIBLE_OFFSET_K = 5;

const VOLUME_SWAPS: Record<string, string[]> = { L: ['mL', 'm3'], mL: ['L'], cm3: ['L'], m3: ['L'] };
const LENGTH_SWAPS: Record<string, string[]> = { mm: ['m'], m: ['mm'] };

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}

export interface BreakContext {
  doc: RunDocument;
  evaluate: Evaluator;
  /** Energy terms of the run as evaluated, J. */
  W: number;
  dU: number;
  Qel: number;
  wall: number;
  Ur: number;
  /** ∫(T − T_ambient) dt in K·s, null without an ambient temperature. */
  leakIntegral: number | null;
  /** Temperature channel's SI per unit (offsets are applied in the channel's unit). */
  temperatureFactor: number;
}

export function breakHints(ctx: BreakContext): Hint[] {
  const { doc, evaluate } = ctx;
  const hints: Hint[] = [];
  const tryAlteration = (code: HintCode, altered: RunDocument, describe: string): boolean => {
    const o = evaluate(altered);
    if (o && o.verdict === 'closes') {
      hints.push({ code, message: `${describe}: the balance would close (En = ${fmt(o.En)}).`, alteredEn: o.En, alteredResidual: o.r });
      return true;
    }
    return false;
  };
  const r = doc.readings;

  if (r.pressure) {
    const to = r.pressure.reference === 'absolute' ? 'gauge' : 'absolute';
    if (to === 'absolute' || doc.ambient?.pressure) {
      tryAlteration('GAUGE_AS_ABSOLUTE', { ...doc, readings: { ...r, pressure: { ...r.pressure, reference: to } } },
        `Pressure logged as ${r.pressure.reference} may be ${to} pressure; read as ${to}`);
    }
  }
  if (r.volume) {
    for (const unit of VOLUME_SWAPS[r.volume.unit] ?? []) {
      if (tryAlteration('ML_AS_L', { ...doc, readings: { ...r, volume: { ...r.volume, unit } } }, `Volumes logged in ${r.volume.unit} may be in ${unit}; read in ${unit}`)) break;
    }
  } else if (r.displacement) {
    for (const unit of LENGTH_SWAPS[r.displacement.unit] ?? []) {
      tryAlteration('ML_AS_L', { ...doc, readings: { ...r, displacement: { ...r.displacement, unit } } }, `Displacements logged in ${r.displacement.unit} may be in ${unit}; read in ${unit}`);
    }
  }
  if (r.temperature.unit === 'K' || r.temperature.unit === 'degC') {
    const unit = r.temperature.unit === 'K' ? 'degC' : 'K';
    const label = (u: string) => (u === 'K' ? 'K' : '°C');
    tryAlteration('CELSIUS_AS_KELVIN', { ...doc, readings: { ...r, temperature: { ...r.temperature, unit } } },
      `Temperatures logged in ${label(r.temperature.unit)} may be in ${label(unit)}; read in ${label(unit)}`);
  }
  temperatureOffsetHint(ctx, hints);
  if (r.current) {
    const unit = r.current.unit === 'A' ? 'mA' : 'A';
    tryAlteration('CURRENT_UNIT', { ...doc, readings: { ...r, current: { ...r.current, unit } } }, `Heater current logged in ${r.current.unit} may be in ${unit}; read in ${unit}`);
  } else if (r.power) {
    const unit = r.power.unit === 'W' ? 'mW' : 'W';
    tryAlteration('CURRENT_UNIT', { ...doc, readings: { ...r, power: { ...r.power, unit } } }, `Heater power logged in ${r.power.unit} may be in ${unit}; read in ${unit}`);
  } else {
    // First law: the heat the balance asks for is ΔU + W (plus what leaks and the walls take up).
    const needed = ctx.dU + ctx.W + ctx.wall;
    if (needed > ctx.Ur) {
      hints.push({ code: 'HEATER_CHANNEL_MISSING', value: needed,
        message: `No heater current or power was recorded, yet the balance asks for about ${fmt(needed)} J of heat; was the heater channel left out of the upload?` });
    }
  }
  const h = doc.apparatus?.heatLossCoefficient;
  if ((!h || h.value === 0) && ctx.leakIntegral !== null && ctx.leakIntegral !== 0 && doc.ambient?.temperature) {
    // Q = Q_el − h·∫(T − T_amb)dt − wall; solve r = 0 for h.
    const hNeeded = (ctx.Qel - ctx.wall - ctx.dU - ctx.W) / ctx.leakIntegral;
    if (hNeeded > 0 && Number.isFinite(hNeeded)) {
      const altered = { ...doc, apparatus: { ...doc.apparatus, heatLossCoefficient: { value: hNeeded, unit: 'W/K', u: 0 } } };
      const o = evaluate(altered);
      if (o && o.verdict === 'closes') {
        hints.push({ code: 'FORGOTTEN_HEAT_LEAK', value: hNeeded, alteredEn: o.En, alteredResidual: o.r,
          message: `No heat leak was accounted for; a heat-loss coefficient h = ${fmt(hNeeded)} W/K (leak ${fmt(hNeeded * ctx.leakIntegral)} J) would close the balance. Measure h on a cooling curve.` });
      }
    }
  }
  return hints;
}

function shiftTemperatures(doc: RunDocument, delta: number): RunDocument {
  const T = doc.readings.temperature;
  return { ...doc, readings: { ...doc.readings, temperature: { ...T, values: T.values.map((v) => v + delta) } } };
}

/** Solves r(δ) = 0 for a common temperature offset δ by the secant method (r is nearly linear in δ). */
function temperatureOffsetHint(ctx: BreakContext, hints: Hint[]): void {
  let d0 = 0;
  const o0 = ctx.evaluate(ctx.doc);
  if (!o0) return;
  let r0 = o0.r;
  const step = 1 / ctx.temperatureFactor; // 1 K in the channel's unit
  let d1 = step;
  const o1 = ctx.evaluate(shiftTemperatures(ctx.doc, d1));
  if (!o1) return;
  let r1 = o1.r;
  for (let it = 0; it < 4 && r1 !== r0; it++) {
    const d2 = d1 - (r1 * (d1 - d0)) / (r1 - r0);
    if (Math.abs(d2 * ctx.temperatureFactor) > 10 * MAX_PLAUSIBLE_OFFSET_K) return;
    const o2 = ctx.evaluate(shiftTemperatures(ctx.doc, d2));
    if (!o2) return;
    [d0, r0, d1, r1] = [d1, r1, d2, o2.r];
  }
  const offsetK = d1 * ctx.temperatureFactor;
  if (Math.abs(offsetK) > MAX_PLAUSIBLE_OFFSET_K) return;
  const o = ctx.evaluate(shiftTemperatures(ctx.doc, d1));
  if (o && o.verdict === 'closes') {
    hints.push({ code: 'TEMPERATURE_OFFSET', value: offsetK, alteredEn: o.En, alteredResidual: o.r,
      message: `A common temperature offset of ${fmt(offsetK)} K on every reading would close the balance (En = ${fmt(o.En)}); check the thermometer's zero against a reference.` });
  }
}

export interface BudgetLine {
  group: string;
  contribution: number;
}

/** For an indeterminate run: the group (instrument or constant) with the largest share of u²(r). */
export function indeterminateHints(budget: readonly BudgetLine[], ur: number, k: number): Hint[] {
  const byGroup = new Map<string, number>();
  for (const b of budget) byGroup.set(b.group, (byGroup.get(b.group) ?? 0) + b.contribution);
  let best: [string, number] | null = null;
  for (const e of byGroup) if (!best || e[1] > best[1]) best = e;
  if (!best || !(ur > 0)) return [];
  const [group, variance] = best;
  // Halving every u of the group quarters its variance contribution.
  const Uhalved = k * Math.sqrt(Math.max(ur * ur - 0.75 * variance, 0));
  return [{ code: 'DOMINANT_SOURCE', value: Uhalved,
    message: `${group} dominates u(r) with ${fmt((100 * variance) / (ur * ur))} % of its variance; with that uncertainty halved, U(r) would be ${fmt(Uhalved)} J instead of ${fmt(k * ur)} J.` }];
}
