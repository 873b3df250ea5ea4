// The calorimetry part of a run's result: corrected temperature rise, Newton's-law heat-leak fit and, for a
// standardization run, the energy equivalent — with the flags that explain disagreements.
import { convergenceTemperature } from './drift-fit';
import { energyEquivalent, referenceMaterialHeat, type EnergyEquivalent, type KnownHeat } from './energy-equivalent';
import type { Flag } from './flags';
import { propagate } from './propagation';
import type { RunModel } from './run-model';
import type { RunDocument } from './run-document';
import type { RunSeries } from './series';
import { analyseRise, PeriodError, withThermometerGain, type RiseMethod, type TemperatureRise, type ValueU } from './temperature-rise';
import { affineToSi } from './units';

export interface HeatLeakFit {
  /** Cooling constant, 1/s. */
  k: ValueU;
  /** Where the drift is zero, K. */
  convergenceTemperature: ValueU;
  /** h = k·C, W/K; null when C is not known. */
  h: ValueU | null;
  /** The C (J/K) the h was computed with, and where it came from. */
  heatCapacity: (ValueU & { source: 'this standardization' | 'apparatus' }) | null;
}

export interface CalorimetryResult {
  temperatureRise: TemperatureRise | null;
  heatLeakFit: HeatLeakFit | null;
  energyEquivalent: EnergyEquivalent | null;
  flags: Flag[];
}

/** Whether a run's result carries the calorimetry fields. */
export const isCalorimetric = (doc: RunDocument): boolean => doc.gas.model === 'calorimeter' || doc.purpose === 'standardization';

const fmt = (x: number, digits = 4) => x.toPrecision(digits);

/**
 * @param electrical ∫U·I dt of the run with its uncertainty sources (from the run model), or null without heater readings.
 * @param k coverage factor for "beyond uncertainty" comparisons.
 */
export function analyseCalorimetry(doc: RunDocument, series: RunSeries, electrical: KnownHeat | null, opts: { method: RiseMethod; k: number }): CalorimetryResult {
  const flags: Flag[] = [];
  if (!isCalorimetric(doc)) return { temperatureRise: null, heatLeakFit: null, energyEquivalent: null, flags };
  const given = doc.periods;
  const timeFactor = doc.readings.time.unit === 'iso' ? 1 : affineToSi('time', doc.readings.time.unit).factor;
  let analysis: ReturnType<typeof analyseRise>;
  try {
    analysis = analyseRise(series.t, series.T.si, opts.method, given ? { mainStart: given.mainStart * timeFactor, mainEnd: given.mainEnd * timeFactor } : undefined);
  } catch (e) {
    if (!(e instanceof PeriodError)) throw e;
    flags.push({ code: 'PERIODS_NOT_FOUND', reading: null, message: `No corrected temperature rise: ${e.message}. Give periods.mainStart and periods.mainEnd, or record longer fore- and after-periods.` });
    return { temperatureRise: null, heatLeakFit: null, energyEquivalent: null, flags };
  }
  const { newton } = analysis;
  // The thermometer's gain is common to both methods: it widens each u(ΔT_c) but not their disagreement (below).
  const thermometer = series.T.instrument ? series.T.label.replace(/^temperature \((.*)\)$/, '$1') : null;
  const rise = withThermometerGain(analysis.rise, series.T.comps.gain, thermometer);
  const rp = rise.regnaultPfaundler, dk = rise.dickinson;
  const uDiff = Math.hypot(rp.u, dk.u);
  if (Math.abs(rp.value - dk.value) > opts.k * uDiff) {
    flags.push({
      code: 'RISE_METHODS_DISAGREE', reading: null,
      message: `The corrected rise by Regnault–Pfaundler (${fmt(rp.value, 6)} K) and by Dickinson's extrapolation (${fmt(dk.value, 6)} K) differ by ${fmt(Math.abs(rp.value - dk.value), 3)} K, more than ${opts.k}·u = ${fmt(opts.k * uDiff, 3)} K: the heat did not enter as the 60 % rule assumes, or the periods are misplaced. The run uses ${rise.method}.`,
    });
  }

  let ee: EnergyEquivalent | null = null;
  if (doc.purpose === 'standardization' && doc.heatSource) {
    const known = doc.heatSource.kind === 'electrical' ? electrical : referenceMaterialHeat(doc.heatSource);
    if (known && rise.corrected.value !== 0) {
      ee = energyEquivalent(known, { value: rise.corrected.value, u: rise.uncertainty.fit, method: rise.method }, thermometer ? { label: thermometer, relativeU: series.T.comps.gain } : undefined);
    }
  }

  const conv = convergenceTemperature(newton);
  const uk = Math.sqrt(Math.max(0, newton.covariance[0][0]));
  const C = ee ? { value: ee.value, u: ee.u, source: 'this standardization' as const } : series.heatCapacity ? { ...series.heatCapacity, source: 'apparatus' as const } : null;
  const h = C ? { value: newton.k * C.value, u: Math.hypot(C.value * uk, newton.k * C.u) } : null; // h = k·C (GUM 5.1.2)
  const typed = series.heatLoss;
  if (h && typed && Math.abs(typed.value - h.value) > opts.k * Math.hypot(typed.u, h.u)) {
    flags.push({
      code: 'HEAT_LEAK_DISAGREES', reading: null,
      message: `The run's heat-loss coefficient h = ${fmt(typed.value)} W/K (from the apparatus, or a standardization's fitted h where the lab applies it) differs from the one fitted to the drifts, ${fmt(h.value)} ± ${fmt(h.u, 2)} W/K (k·C with the cooling constant k = ${fmt(newton.k)} 1/s), by more than ${opts.k}·u: update the apparatus or check the drift periods.`,
    });
  }
  return {
    temperatureRise: rise,
    heatLeakFit: { k: { value: newton.k, u: uk }, convergenceTemperature: conv, h, heatCapacity: C },
    energyEquivalent: ee,
    flags,
  };
}

/** ∫U·I dt of the run with the instrument sources behind its uncertainty (GUM law of propagation), or null without heater readings. */
export function electricalHeat(series: RunSeries, model: RunModel): KnownHeat | null {
  if (!((series.U && series.I) || series.Pw)) return null;
  const p = propagate(model.inputs, model.electrical, ['Qel']);
  const sources = model.inputs
    .map((q, j) => ({ source: q.name, unit: q.unit, value: q.value, u: q.u, sensitivity: p.sensitivities[0][j] }))
    .filter((s) => s.sensitivity !== 0);
  return { value: p.values[0], u: p.u[0], sources, description: 'electrical energy ∫U·I dt' };
}
