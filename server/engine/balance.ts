// The orchestrator: run document in, energy balance with its uncertainty, verdict, flags and hints out.
import type { AppliedCorrection } from '../../contract/corrections';
import { analyseCalorimetry, electricalHeat, type HeatLeakFit } from './calorimetry';
import { sha256Canonical } from './canonical';
import type { EnergyEquivalent } from './energy-equivalent';
import { RISE_METHODS, type RiseMethod, type TemperatureRise } from './temperature-rise';
import { dataQualityFlags, FLAG_DEFAULTS, type Flag, type FlagSettings } from './flags';
import { heaterFindings } from './heater-check';
import { checkRange, equipartitionModel, gamma, speciesModel, type HeatCapacityModel } from './gases';
import { breakHints, indeterminateHints, type Hint, type Outcome } from './hints';
import { compareWithLinear, monteCarlo, type Histogram } from './monte-carlo';
import { claimedIndex, indexOffsetSensitivity, polytropicFit } from './polytropic';
import { propagate } from './propagation';
import { validateRunDocument, type RunDocument, type ValidationError } from './run-document';
import { criticalConstants } from './real-gas';
import { buildRunModel, type RealGasOption, type SourceKind } from './run-model';
import { buildSeries, type RunSeries } from './series';
import { ENGINE_VERSION } from './version';
import { verdictOf, type Verdict } from './verdict';
import { modelWork } from './work';

export interface BalanceSettings extends Partial<FlagSettings> {
  /** Coverage factor k for expanded uncertainties (default 2). */
  coverageFactor?: number;
  /** Monte Carlo draws (default 10⁵); 0 skips the Monte Carlo check. */
  draws?: number;
  /** PRNG seed; default derived from the document hash, so a result is reproducible. */
  seed?: number | string;
  /** U(r) above this fraction of max(|Q|, |W|, |ΔU|) makes the verdict indeterminate (default 0.20). */
  indeterminateFraction?: number;
  /** Corrected-rise method a calorimetric result uses (a lab setting; default Regnault–Pfaundler). */
  riseMethod?: RiseMethod;
}

export interface BudgetEntry {
  source: string;
  group: string;
  kind: SourceKind;
  distribution: 'normal' | 'rectangular';
  unit: string;
  /** Standard uncertainty of the source, in `unit`. */
  u: number;
  /** ∂r/∂x, J per `unit`. */
  sensitivity: number;
  /** ∂W/∂x, ∂Q/∂x, ∂ΔU/∂x. */
  sensitivities: { W: number; Q: number; dU: number };
  /** c²u², J². */
  contribution: number;
  /** Share of u²(r), 0..1. */
  share: number;
}

export interface BalanceResult {
  engineVersion: string;
  inputHash: string;
  documentHash: string;
  settings: Required<BalanceSettings>;
  process: { claimed: string; index: number | null };
  gas: string;
  /** γ = Cp/Cv of the gas model at the mean of T1 and T2 (ideal gas); null for a calorimeter without a gas. */
  gamma: number | null;
  amount: { n: number | null; source: string };
  temperatures: { T1: number; T2: number };
  work: { measured: number; u: number; U: number; model: number | null; modelFormula: string; gap: number | null };
  heat: { electrical: number; leak: number; wall: number; total: number; u: number; U: number };
  /** ideal: n·∫Cv dT (or C·ΔT); departure: the real-gas part of value (0 when not applied), J. */
  internalEnergy: { value: number; u: number; U: number; method: string; ideal: number; departure: number; departureMethod: string | null };
  residual: { r: number; u: number; U: number; k: number };
  correlations: { W_Q: number; W_dU: number; Q_dU: number };
  En: number | null;
  verdict: Verdict;
  indeterminateLimit: number;
  budget: BudgetEntry[];
  monteCarlo: { draws: number; seed: number | string; mean: number; sd: number; low: number; high: number; coverage: number; agreesWithLinear: boolean; tolerance: number; note: string; histogram: Histogram } | null;
  polytropicFit: { index: number; uIndex: number; rSquared: number; points: number; claimedIndex: number | 'infinite' | null } | null;
  flags: Flag[];
  hints: Hint[];
  /** Calorimetric runs (gas.model "calorimeter" or purpose "standardization"): corrected rise, fitted heat leak. */
  purpose: 'measurement' | 'standardization';
  temperatureRise: TemperatureRise | null;
  heatLeakFit: HeatLeakFit | null;
  /** Standardization runs: ε = Q_known / ΔT_corrected, J/K. */
  energyEquivalent: EnergyEquivalent | null;
  /** Certificate corrections applied to the readings before the check (reading × gain + offset, GUM 3.2.3); empty when none. */
  corrections: AppliedCorrection[];
}

export type CheckResult = { ok: true; result: BalanceResult } | { ok: false; errors: ValidationError[] };

/** An input the engine can read but cannot evaluate (e.g. a temperature outside a heat-capacity fit's range). */
export class EngineInputError extends Error {
  constructor(readonly path: string, message: string) {
    super(message);
  }
}

const DEFAULTS = { coverageFactor: 2, draws: 100_000, indeterminateFraction: 0.2, riseMethod: 'regnault-pfaundler' as RiseMethod, ...FLAG_DEFAULTS };
const FLAG_KEYS = Object.keys(FLAG_DEFAULTS) as (keyof FlagSettings)[];
/** Upper bound on Monte Carlo draws per request (memory: 8 bytes per draw). */
export const MAX_DRAWS = 10_000_000;

/** The second-virial departure: on by default for a species gas the correlation covers. */
function realGasOption(doc: RunDocument): RealGasOption | null {
  if (doc.gas.model !== 'species' || doc.gas.realGas === false) return null;
  const critical = criticalConstants(doc.gas.species);
  return critical ? { critical } : null;
}

function heatCapacityModel(doc: RunDocument): HeatCapacityModel | null {
  if (doc.gas.model === 'species') return speciesModel(doc.gas.species);
  if (doc.gas.model === 'equipartition') return equipartitionModel(doc.gas.f);
  return null;
}

interface Core {
  series: RunSeries;
  gasModel: HeatCapacityModel | null;
  model: ReturnType<typeof buildRunModel>;
  prop: ReturnType<typeof propagate>;
  outcome: Outcome;
  limit: number;
  k: number;
}

function core(doc: RunDocument, k: number, fraction: number): Core {
  const series = buildSeries(doc);
  const gasModel = heatCapacityModel(doc);
  if (gasModel) {
    for (const [i, T] of [[0, series.T.si[0]], [series.N - 1, series.T.si[series.N - 1]]] as const) {
      const problem = checkRange(gasModel, T);
      if (problem) throw new EngineInputError(`readings.temperature[${i}]`, `cannot compute ΔU: ${problem}`);
    }
  }
  const model = buildRunModel(series, gasModel, realGasOption(doc));
  const prop = propagate(model.inputs, model.evaluate, ['W', 'Q', 'dU', 'r']);
  const [W, Q, dU, r] = prop.values;
  const Ur = k * prop.u[3];
  const v = verdictOf(r, Ur, Math.max(Math.abs(Q), Math.abs(W), Math.abs(dU)), fraction);
  return { series, gasModel, model, prop, outcome: { r, Ur, En: v.En, verdict: v.verdict }, limit: v.limit, k };
}

function finite(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}

export function evaluateBalance(doc: RunDocument, settings: BalanceSettings = {}): BalanceResult {
  const documentHash = sha256Canonical(doc);
  const effective: Required<BalanceSettings> = {
    coverageFactor: settings.coverageFactor ?? DEFAULTS.coverageFactor,
    draws: settings.draws ?? DEFAULTS.draws,
    seed: settings.seed ?? parseInt(documentHash.slice(0, 8), 16),
    indeterminateFraction: settings.indeterminateFraction ?? DEFAULTS.indeterminateFraction,
    riseMethod: settings.riseMethod ?? DEFAULTS.riseMethod,
    ...Object.fromEntries(FLAG_KEYS.map((key) => [key, settings[key] ?? DEFAULTS[key]])) as unknown as FlagSettings,
  };
  const k = effective.coverageFactor;
  const c = core(doc, k, effective.indeterminateFraction);
  const { series, gasModel, model, prop, outcome } = c;
  const [W, Q, dU] = prop.values;
  const [uW, uQ, udU, ur] = prop.u;
  const nom = model.nominal;
  const last = series.N - 1;

  const hasPath = !!(series.P && series.V && series.V.label !== 'vessel volume');
  // γ for the adiabatic model and the claimed index: at the mean of the end temperatures, where Cp(T) varies.
  const Tmean = 0.5 * (nom.T1 + nom.T2);
  const g = gasModel ? gamma(gasModel, Tmean) : undefined;
  let modelW: { value: number | null; formula: string } = { value: null, formula: 'no pressure–volume path' };
  if (series.P && series.V) {
    let pm = 0;
    for (let i = 0; i <= last; i++) pm += series.P.si[i];
    modelW = modelWork({
      process: doc.process.claimed, P1: series.P.si[0], V1: series.V.si[0], P2: series.P.si[last], V2: series.V.si[last],
      Pmean: pm / series.N, n: nom.n ?? NaN, T1: nom.T1, gamma: g, index: doc.process.index,
    });
    if (modelW.value !== null && !Number.isFinite(modelW.value)) modelW = { value: null, formula: modelW.formula + ' (not defined for this run)' };
  } else if (doc.process.claimed === 'isochoric') modelW = modelWork({ process: 'isochoric', P1: 0, V1: 0, P2: 0, V2: 0, Pmean: 0, n: 0, T1: 0 });

  const fit = hasPath ? polytropicFit(series.P!.si, series.V!.si) : null;
  const claimed = claimedIndex(doc.process.claimed, g, doc.process.index);

  // The index's uncertainty from offsets common to all pressure or all volume readings (they bend ln P on ln V).
  let uSystematic = 0;
  if (fit) {
    const d = indexOffsetSensitivity(series.P!.si, series.V!.si);
    const P = series.P!, V = series.V!;
    const uP = Math.hypot(P.factor * P.comps.fullScaleOffset, P.factor * P.comps.calibrationOffset, series.gauge ? (series.ambientPressure?.u ?? 0) : 0);
    const uV = Math.hypot(V.factor * V.comps.fullScaleOffset, V.factor * V.comps.calibrationOffset, series.volumeOffsetU);
    if (d) uSystematic = Math.hypot(d.dP * uP, d.dV * uV);
  }
  const calorimetry = analyseCalorimetry(doc, series, doc.purpose === 'standardization' ? electricalHeat(series, model) : null, { method: effective.riseMethod, k });
  const flags = [...dataQualityFlags({ doc, series, electricalHeat: nom.Qel, work: W, fit: fit ? { ...fit, uSystematic } : null, claimedIndex: claimed, settings: effective }), ...calorimetry.flags];

  const u2 = ur * ur;
  const budget: BudgetEntry[] = model.inputs.map((q, j) => ({
    source: q.name,
    group: q.group,
    kind: q.kind,
    distribution: q.distribution,
    unit: q.unit,
    u: q.u,
    sensitivity: prop.sensitivities[3][j],
    sensitivities: { W: prop.sensitivities[0][j], Q: prop.sensitivities[1][j], dU: prop.sensitivities[2][j] },
    contribution: prop.contributions[3][j],
    share: u2 > 0 ? prop.contributions[3][j] / u2 : 0,
  })).sort((a, b) => b.contribution - a.contribution);

  let mc: BalanceResult['monteCarlo'] = null;
  if (effective.draws > 0 && model.inputs.length > 0) {
    const m = monteCarlo(model.inputs, model.residual, { draws: effective.draws, seed: effective.seed });
    const agreement = compareWithLinear(outcome.r, ur, m);
    mc = {
      draws: m.draws, seed: m.seed, mean: m.mean, sd: m.sd, low: m.low, high: m.high, coverage: m.coverage, histogram: m.histogram,
      agreesWithLinear: agreement.agrees, tolerance: agreement.tolerance,
      note: agreement.agrees
        ? `The Monte Carlo 95 % interval agrees with r ± 1.96·u(r) within ${agreement.tolerance.toPrecision(2)} J (JCGM 101 §8.2).`
        : `The Monte Carlo 95 % interval [${m.low.toPrecision(6)}, ${m.high.toPrecision(6)}] J differs from the linear r ± 1.96·u(r) by up to ${Math.max(agreement.dLow, agreement.dHigh).toPrecision(2)} J, more than the ${agreement.tolerance.toPrecision(2)} J JCGM 101 §8.2 allows: the model is not linear enough over the inputs' spread; prefer the Monte Carlo interval.`,
    };
  }

  let hints: Hint[] = [];
  if (outcome.verdict === 'breaks') {
    const evaluate = (d: RunDocument): Outcome | null => {
      const v = validateRunDocument(d);
      if (!v.ok) return null;
      try {
        return core(v.doc, k, effective.indeterminateFraction).outcome;
      } catch {
        return null;
      }
    };
    hints = breakHints({
      doc, evaluate, W, dU, Qel: nom.Qel, wall: nom.wall, Ur: outcome.Ur,
      leakIntegral: series.ambientTemperature ? leakIntegral(series) : null,
      temperatureFactor: series.T.factor,
    });
    // A cause strong enough to close the balance is named among the flags too, not only below the budget.
    for (const h of hints) flags.push({ code: 'LIKELY_CAUSE', reading: null, message: `Likely cause of the break (${h.code}): ${h.message}` });
  } else if (outcome.verdict === 'indeterminate') {
    hints = indeterminateHints(budget, ur, k);
  }
  for (const f of heaterFindings(series, { coverage: effective.flagCoverage, resistanceTolerance: effective.heaterResistanceTolerance })) {
    hints.push({ code: 'HEATER_CHANNEL_SUSPECT', message: f.hint });
  }

  const amountSource = series.amount.kind === 'none' ? 'calorimeter (C·ΔT)' : series.amount.kind === 'initialState' ? 'initial state n = P1·V1/(Z·R·T1)' : series.amount.kind === 'mass' ? 'mass n = m/M' : 'given';
  return {
    engineVersion: ENGINE_VERSION,
    // Hashing the document's hash with the settings keeps one pass over the readings (a Merkle-style digest).
    inputHash: sha256Canonical({ documentHash, settings: effective }),
    documentHash,
    settings: effective,
    process: { claimed: doc.process.claimed, index: doc.process.index ?? null },
    gas: gasModel ? gasModel.label : 'calorimeter',
    gamma: g ?? null,
    amount: { n: nom.n, source: amountSource },
    temperatures: { T1: nom.T1, T2: nom.T2 },
    work: { measured: W, u: uW, U: k * uW, model: modelW.value, modelFormula: modelW.formula, gap: modelW.value === null ? null : W - modelW.value },
    heat: { electrical: nom.Qel, leak: nom.leak, wall: nom.wall, total: Q, u: uQ, U: k * uQ },
    internalEnergy: {
      value: dU, u: udU, U: k * udU, ideal: nom.dUideal, departure: nom.dUdeparture, departureMethod: model.departureMethod,
      method: gasModel ? `n·∫Cv dT, ${gasModel.label}${nom.dUdeparture !== 0 ? ', plus the real-gas departure' : ''}` : 'C·ΔT',
    },
    residual: { r: outcome.r, u: ur, U: outcome.Ur, k },
    correlations: { W_Q: prop.correlation[0][1], W_dU: prop.correlation[0][2], Q_dU: prop.correlation[1][2] },
    En: finite(outcome.En),
    verdict: outcome.verdict,
    indeterminateLimit: c.limit,
    budget,
    monteCarlo: mc,
    polytropicFit: fit ? { ...fit, claimedIndex: claimed === null ? null : Number.isFinite(claimed) ? claimed : 'infinite' } : null,
    flags,
    hints,
    purpose: doc.purpose ?? 'measurement',
    temperatureRise: calorimetry.temperatureRise,
    heatLeakFit: calorimetry.heatLeakFit,
    energyEquivalent: calorimetry.energyEquivalent,
    corrections: series.corrections,
  };
}

/** ∫(T − T_ambient) dt by the trapezoid, K·s. */
function leakIntegral(series: RunSeries): number {
  const { t, T } = series;
  const Ta = series.ambientTemperature!.value;
  let s = 0;
  for (let i = 0; i + 1 < series.N; i++) s += 0.5 * (T.si[i] + T.si[i + 1] - 2 * Ta) * (t[i + 1] - t[i]);
  return s;
}

/** Validate, then evaluate: the one entrance for POST /api/balance and the CLI. */
export function checkRunDocument(input: unknown, settings: BalanceSettings = {}): CheckResult {
  const settingErrors = validateSettings(settings);
  const v = validateRunDocument(input);
  if (!v.ok || settingErrors.length > 0) return { ok: false, errors: [...(v.ok ? [] : v.errors), ...settingErrors] };
  try {
    return { ok: true, result: evaluateBalance(v.doc, settings) };
  } catch (e) {
    if (e instanceof EngineInputError) return { ok: false, errors: [{ path: e.path, message: e.message }] };
    throw e;
  }
}

/** Settings come from a lab's configuration or a request; refuse values the engine cannot honour. */
export function validateSettings(settings: BalanceSettings): ValidationError[] {
  const errors: ValidationError[] = [];
  const { coverageFactor: k, draws, seed, indeterminateFraction: f } = settings;
  if (k !== undefined && !(typeof k === 'number' && k > 0 && Number.isFinite(k))) errors.push({ path: 'settings.coverageFactor', message: 'must be a number greater than 0' });
  if (draws !== undefined && !(Number.isInteger(draws) && draws >= 0 && draws <= MAX_DRAWS)) errors.push({ path: 'settings.draws', message: `must be an integer from 0 to ${MAX_DRAWS}` });
  if (seed !== undefined && !(typeof seed === 'string' || Number.isFinite(seed))) errors.push({ path: 'settings.seed', message: 'must be a number or a string' });
  if (f !== undefined && !(typeof f === 'number' && f > 0 && Number.isFinite(f))) errors.push({ path: 'settings.indeterminateFraction', message: 'must be a number greater than 0' });
  if (settings.riseMethod !== undefined && !RISE_METHODS.includes(settings.riseMethod)) errors.push({ path: 'settings.riseMethod', message: `must be one of ${RISE_METHODS.join(', ')}` });
  for (const key of FLAG_KEYS) {
    const v = settings[key];
    if (v !== undefined && !(typeof v === 'number' && v >= 0 && Number.isFinite(v))) errors.push({ path: `settings.${key}`, message: 'must be a number of at least 0' });
  }
  return errors;
}
