// Data-quality flags: what is wrong, at which reading (1-based, as people count), and why it matters.
import { quickselect } from 'simple-statistics';
import { correctionFormula } from '../../contract/corrections';
import { unitSymbol } from '../../contract/units';
import { dayOf, statedCorrection } from './corrections';
import { heaterFindings } from './heater-check';
import type { Instrument, RunDocument } from './run-document';
import type { ChannelSeries, RunSeries } from './series';
import { toSi } from './units';

export type FlagCode =
  | 'TIME_NOT_INCREASING'
  | 'TIME_GAP'
  | 'NEGATIVE_ABSOLUTE_PRESSURE'
  | 'NONPOSITIVE_TEMPERATURE'
  | 'OUT_OF_RANGE'
  | 'OUT_OF_CALIBRATION'
  | 'ABOVE_RATED_PRESSURE'
  | 'ISOTHERMAL_DRIFT'
  | 'ISOCHORIC_VOLUME_CHANGE'
  | 'ADIABATIC_HEATER_POWER'
  | 'INDEX_FAR_FROM_CLAIM'
  // calorimetry (calorimetry.ts) and the apparatus's standardization (server/standardizations)
  | 'PERIODS_NOT_FOUND'
  | 'RISE_METHODS_DISAGREE'
  | 'HEAT_LEAK_DISAGREES'
  | 'STANDARDIZATION_DUE'

  | 'HEATER_CURRENT_WITHOUT_VOLTAGE'
  | 'HEATER_VOLTAGE_WITHOUT_CURRENT'
  | 'HEATER_RESISTANCE_UNSTEADY'
  | 'UNCERTAINTY_NOT_STATED'
  | 'LIKELY_CAUSE';

export interface Flag {
  code: FlagCode;
  /** 1-based reading number, or null when the flag concerns the whole run or an instrument. */
  reading: number | null;
  message: string;
  /** The run cannot be submitted while this stands (a channel whose uncertainty is not stated). */
  blocking?: boolean;
  /** On the closing line of a code listed only in part: how many more readings raise it. */
  more?: number;
}

/** A gap is a time step longer than this many times the median step. */
export const GAP_FACTOR = 5;
/**
 * The lab's flag thresholds (lab settings; defaults in FLAG_DEFAULTS). Each claim flag tests a drift or an index
 * against its propagated uncertainty times `flagCoverage` and, on top, a tolerance the claim allows.
 */
export interface FlagSettings {
  /** Standard uncertainties a drift, index or heater spread must exceed before it is flagged (default 3). */
  flagCoverage: number;
  /** An isothermal run may drift this fraction of its mean absolute temperature (default 0.01). */
  isothermalDriftFraction: number;
  /** An isochoric run's volume may change this fraction of its mean (default 0.005). */
  isochoricVolumeFraction: number;
  /** Heater energy above this fraction of |W| contradicts an adiabatic claim (default 0.01). */
  adiabaticHeatFraction: number;
  /** A fitted index may differ from the claimed one by this much in any case (default 0.05). */
  indexTolerance: number;
  /** A heater's resistance may drift this fraction with its own temperature (default 0.02). */
  heaterResistanceTolerance: number;
}

export const FLAG_DEFAULTS: Readonly<FlagSettings> = {
  flagCoverage: 3,
  isothermalDriftFraction: 0.01,
  isochoricVolumeFraction: 0.005,
  adiabaticHeatFraction: 0.01,
  indexTolerance: 0.05,
  heaterResistanceTolerance: 0.02,
};
/** Most blocks a drift is judged on: block means average the per-reading noise down by √(readings per block). */
const DRIFT_BLOCKS = 20;
/** Per code, list this many readings, then one summary flag. */
const MAX_PER_CODE = 10;

export interface FlagContext {
  doc: RunDocument;
  series: RunSeries;
  electricalHeat: number;
  work: number;
  /** uIndex: the fit's standard error; uSystematic: the index's uncertainty from pressure and volume offsets. */
  fit: { index: number; uIndex: number; uSystematic: number } | null;
  claimedIndex: number | null;
  settings: FlagSettings;
}

class FlagList {
  readonly flags: Flag[] = [];
  private counts = new Map<FlagCode, number>();
  add(code: FlagCode, reading: number | null, message: string, blocking = false): void {
    const n = (this.counts.get(code) ?? 0) + 1;
    this.counts.set(code, n);
    if (n <= MAX_PER_CODE) this.flags.push(blocking ? { code, reading, message, blocking } : { code, reading, message });
  }
  summarise(): void {
    for (const [code, n] of this.counts) {
      if (n > MAX_PER_CODE) this.flags.push({ code, reading: null, message: `${n - MAX_PER_CODE} more readings raise ${code}; only the first ${MAX_PER_CODE} are listed.`, more: n - MAX_PER_CODE });
    }
  }
}

/** Median by selection (simple-statistics quickselect, O(N)) of a scratch array it may reorder. */
function medianInPlace(a: Float64Array): number {
  const arr = a as unknown as number[]; // quickselect only indexes and swaps
  const m = a.length >> 1;
  quickselect(arr, m);
  const hi = a[m];
  if (a.length % 2) return hi;
  let lo = -Infinity;
  for (let i = 0; i < m; i++) if (a[i] > lo) lo = a[i];
  return 0.5 * (lo + hi);
}

function fmt(x: number): string {
  return Number(x.toPrecision(6)).toString();
}

/** A pressure in Pa as kPa, four significant digits: how the lab reads a gauge. */
function kPa(pa: number): string {
  return Number((pa / 1000).toPrecision(4)).toString();
}

function spanOf(a: Float64Array): { min: number; max: number; iMin: number; iMax: number; mean: number } {
  let min = Infinity, max = -Infinity, iMin = 0, iMax = 0, sum = 0;
  for (let i = 0; i < a.length; i++) {
    if (a[i] < min) { min = a[i]; iMin = i; }
    if (a[i] > max) { max = a[i]; iMax = i; }
    sum += a[i];
  }
  return { min, max, iMin, iMax, mean: sum / a.length };
}

/**
 * The span of block means of a channel (up to DRIFT_BLOCKS consecutive blocks) and the standard uncertainty of
 * the difference of two block means: √2·u_random/√m (offsets and gains common to the run cancel in a difference).
 */
function blockSpan(ch: ChannelSeries): { span: number; u: number; iLo: number; iHi: number; mean: number; m: number } {
  const n = ch.si.length;
  const m = Math.max(1, Math.floor(n / DRIFT_BLOCKS));
  let lo = Infinity, hi = -Infinity, iLo = 0, iHi = 0, sum = 0, total = 0;
  for (let start = 0; start + m <= n; start += m) {
    let s = 0;
    for (let i = start; i < start + m; i++) s += ch.si[i];
    const b = s / m;
    if (b < lo) { lo = b; iLo = start; }
    if (b > hi) { hi = b; iHi = start; }
  }
  for (let i = 0; i < n; i++) total += ch.si[i];
  sum = total / n;
  const u = (Math.SQRT2 * ch.comps.random * ch.factor) / Math.sqrt(m);
  return { span: hi - lo, u, iLo, iHi, mean: sum, m };
}

/** The stated correction in words, with the unit it is stated in (the channel's when the document gives none). */
function correctionOf(inst: Instrument, channelUnit: string): { gain: number; offset: number; unit: string } {
  const c = inst.calibration!.correction!;
  return { gain: c.gain ?? 1, offset: c.offset ?? 0, unit: c.unit ?? channelUnit };
}

export function dataQualityFlags(ctx: FlagContext): Flag[] {
  const { doc, series } = ctx;
  const out = new FlagList();
  const { t, N } = series;

  const steps = new Float64Array(Math.max(N - 1, 0));
  for (let i = 0; i + 1 < N; i++) {
    steps[i] = t[i + 1] - t[i];
    if (!(steps[i] > 0)) out.add('TIME_NOT_INCREASING', i + 2, `Reading ${i + 2} is at ${fmt(t[i + 1])} s, not after reading ${i + 1} at ${fmt(t[i])} s; the integrals need readings in time order.`);
  }
  // Typed-array loops instead of filter/from: this runs over every reading of runs of 10⁶ points.
  let count = 0;
  for (let i = 0; i < steps.length; i++) if (steps[i] > 0) count++;
  const positive = new Float64Array(count);
  for (let i = 0, j = 0; i < steps.length; i++) if (steps[i] > 0) positive[j++] = steps[i];
  if (positive.length > 0) {
    const med = medianInPlace(positive);
    for (let i = 0; i < steps.length; i++) {
      if (steps[i] > GAP_FACTOR * med) out.add('TIME_GAP', i + 2, `Readings ${i + 1} to ${i + 2} are ${fmt(steps[i])} s apart, more than ${GAP_FACTOR}× the median step of ${fmt(med)} s; the trapezoid bridges the gap with a straight line.`);
    }
  }

  if (series.P) {
    for (let i = 0; i < N; i++) {
      if (series.P.si[i] <= 0) out.add('NEGATIVE_ABSOLUTE_PRESSURE', i + 1, `Reading ${i + 1} gives an absolute pressure of ${fmt(series.P.si[i])} Pa; absolute pressure must be positive (was a gauge reading logged as absolute?).`);
    }
  }
  for (let i = 0; i < N; i++) {
    if (series.T.si[i] <= 0) out.add('NONPOSITIVE_TEMPERATURE', i + 1, `Reading ${i + 1} gives ${fmt(series.T.si[i])} K; thermodynamic temperature must be above 0 K (check the temperature unit).`);
  }

  const channels: ChannelSeries[] = [series.P, series.V, series.T, series.U, series.I, series.Pw].filter((c): c is ChannelSeries => !!c);
  const runDay = dayOf(doc.runDate);
  for (const ch of channels) {
    const inst = ch.instrument;
    if (!inst) continue;
    if (inst.range) {
      for (let i = 0; i < N; i++) {
        const v = ch.raw[i];
        if (v < inst.range.min || v > inst.range.max) {
          out.add('OUT_OF_RANGE', i + 1, `Reading ${i + 1} of ${inst.id} is ${fmt(v)} ${unitSymbol(ch.unit)}, outside its range ${inst.range.min} to ${inst.range.max} ${unitSymbol(ch.unit)}; its specification does not hold there.`);
        }
      }
    }
    // A certificate not in force does not describe the instrument on the run date: its correction is not applied (corrections.ts).
    const unapplied = statedCorrection(inst) ? ` Its certificate's correction (${correctionFormula(correctionOf(inst, ch.unit))}) is not applied.` : '';
    if (inst.dueDate && runDay > dayOf(inst.dueDate)) {
      out.add('OUT_OF_CALIBRATION', null, `${inst.id} was due for calibration on ${inst.dueDate}, before the run date ${doc.runDate}; its certificate no longer covers these readings.${unapplied}`);
    } else if (inst.calibrationDate && runDay < dayOf(inst.calibrationDate)) {
      out.add('OUT_OF_CALIBRATION', null, `${inst.id} was calibrated on ${inst.calibrationDate}, after the run date ${doc.runDate}; no certificate covers these readings.${unapplied}`);
    }
  }

  const rated = doc.apparatus?.ratedPressure;
  if (rated && series.P) {
    // An absolute rating is compared as it stands; a gauge rating (the usual vessel plate) lies above the run's
    // barometric pressure: P_abs = P_gauge + P_barometric (common practice).
    const gauge = rated.reference === 'gauge';
    const ratedPa = toSi('pressure', rated.unit, rated.value) + (gauge ? (series.ambientPressure?.value ?? 0) : 0);
    // In kPa, as the readings are said; a rating written in another unit keeps its own figure beside it.
    const asWritten = rated.unit === 'Pa' || rated.unit === 'kPa' ? '' : ` (${fmt(rated.value)} ${rated.unit})`;
    const ratedText = `${kPa(toSi('pressure', rated.unit, rated.value))} kPa ${gauge ? 'gauge' : 'absolute'}${asWritten}`;
    for (let i = 0; i < N; i++) {
      const p = series.P.si[i];
      if (p > ratedPa) {
        const reading = gauge ? `${kPa(p - (series.ambientPressure?.value ?? 0))} kPa gauge` : `${kPa(p)} kPa absolute`;
        out.add('ABOVE_RATED_PRESSURE', i + 1, `Reading ${i + 1} reaches ${reading}, above the vessel's rated ${ratedText}; stay within the vessel's rating and the lab's safety review.`);
      }
    }
  }

  const claimed = doc.process.claimed;
  const st = ctx.settings;
  const k = st.flagCoverage;
  if (claimed === 'isothermal') {
    const b = blockSpan(series.T);
    const allowed = st.isothermalDriftFraction * Math.abs(b.mean) + k * b.u;
    if (b.span > allowed) {
      const worst = Math.abs(series.T.si[b.iHi] - series.T.si[0]) > Math.abs(series.T.si[b.iLo] - series.T.si[0]) ? b.iHi : b.iLo;
      out.add('ISOTHERMAL_DRIFT', worst + 1, `The run is claimed isothermal but its temperature (means of ${b.m} reading(s)) spans ${fmt(b.span)} K, more than the ${st.isothermalDriftFraction * 100} % of ${fmt(b.mean)} K the claim allows plus ${k} standard uncertainties of the span (${fmt(k * b.u)} K); furthest from the start near reading ${worst + 1}.`);
    }
  }
  if (claimed === 'isochoric' && series.V) {
    const b = blockSpan(series.V);
    const allowed = st.isochoricVolumeFraction * Math.abs(b.mean) + k * b.u;
    if (b.span > allowed) {
      out.add('ISOCHORIC_VOLUME_CHANGE', b.iHi + 1, `The run is claimed isochoric but its volume (means of ${b.m} reading(s)) spans ${fmt(b.span)} m³, more than the ${st.isochoricVolumeFraction * 100} % of ${fmt(b.mean)} m³ the claim allows plus ${k} standard uncertainties of the span (${fmt(k * b.u)} m³); largest near reading ${b.iHi + 1}.`);
    }
  }
  if (claimed === 'adiabatic' && ctx.electricalHeat !== 0 && Math.abs(ctx.electricalHeat) > st.adiabaticHeatFraction * Math.abs(ctx.work)) {
    let iMax = 0;
    let pMax = -Infinity;
    for (let i = 0; i < N; i++) {
      const p = series.Pw ? series.Pw.si[i] : (series.U?.si[i] ?? 0) * (series.I?.si[i] ?? 0);
      if (p > pMax) { pMax = p; iMax = i; }
    }
    out.add('ADIABATIC_HEATER_POWER', iMax + 1, `The run is claimed adiabatic but the heater delivered ${fmt(ctx.electricalHeat)} J (peak ${fmt(pMax)} W at reading ${iMax + 1}), more than ${st.adiabaticHeatFraction * 100} % of |W|.`);
  }
  if (ctx.fit && ctx.claimedIndex !== null && Number.isFinite(ctx.claimedIndex)) {
    const diff = Math.abs(ctx.fit.index - ctx.claimedIndex);
    const u = Math.hypot(ctx.fit.uIndex, ctx.fit.uSystematic);
    if (diff > Math.max(k * u, st.indexTolerance)) {
      out.add('INDEX_FAR_FROM_CLAIM', null, `The fitted polytropic index ${fmt(ctx.fit.index)} ± ${fmt(u)} (fit and pressure/volume offsets) is far from ${fmt(ctx.claimedIndex)}, the index a ${claimed} process implies: the difference ${fmt(diff)} exceeds ${k} standard uncertainties and ${st.indexTolerance}.`);
    }
  }
  for (const ch of channels) {
    if (ch.instrument || ch.label === 'vessel volume') continue;
    out.add('UNCERTAINTY_NOT_STATED', null, `The ${ch.key} channel names no instrument, so its readings add no uncertainty to the budget and the verdict overstates the confidence; choose the instrument that read it before the run is submitted.`, true);
  }
  for (const f of heaterFindings(series, { coverage: k, resistanceTolerance: st.heaterResistanceTolerance })) out.add(f.code, f.reading, f.message);
  out.summarise();
  return out.flags;
}
