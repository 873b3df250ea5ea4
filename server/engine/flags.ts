// Data-quality flags: what is wrong, at which reading (1-based, as people count), and why it matters.
import { quickselect } from 'simple-statistics';
import type { RunDocument } from './run-document';
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
  | 'STANDARDIZATION_DUE';

export interface Flag {
  code: FlagCode;
  /** 1-based reading number, or null when the flag concerns the whole run or an instrument. */
  reading: number | null;
  message: string;
}

/** A gap is a time step longer than this many times the median step. */
export const GAP_FACTOR = 5;
/** An isothermal run drifts when max T − min T exceeds this fraction of the mean absolute temperature. */
export const ISOTHERMAL_DRIFT_FRACTION = 0.01;
/** An isochoric run changes volume when max V − min V exceeds this fraction of the mean volume. */
export const ISOCHORIC_VOLUME_FRACTION = 0.005;
/** Heater energy above this fraction of |W| contradicts an adiabatic claim. */
export const ADIABATIC_HEAT_FRACTION = 0.01;
/** A fitted index is far when it differs from the claimed one by more than 3 standard errors and this much. */
export const INDEX_ABS_TOLERANCE = 0.05;
/** Per code, list this many readings, then one summary flag. */
const MAX_PER_CODE = 10;

export interface FlagContext {
  doc: RunDocument;
  series: RunSeries;
  electricalHeat: number;
  work: number;
  fit: { index: number; uIndex: number } | null;
  claimedIndex: number | null;
}

class FlagList {
  readonly flags: Flag[] = [];
  private counts = new Map<FlagCode, number>();
  add(code: FlagCode, reading: number | null, message: string): void {
    const n = (this.counts.get(code) ?? 0) + 1;
    this.counts.set(code, n);
    if (n <= MAX_PER_CODE) this.flags.push({ code, reading, message });
  }
  summarise(): void {
    for (const [code, n] of this.counts) {
      if (n > MAX_PER_CODE) this.flags.push({ code, reading: null, message: `${n - MAX_PER_CODE} more readings raise ${code}; only the first ${MAX_PER_CODE} are listed.` });
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

function spanOf(a: Float64Array): { min: number; max: number; iMin: number; iMax: number; mean: number } {
  let min = Infinity, max = -Infinity, iMin = 0, iMax = 0, sum = 0;
  for (let i = 0; i < a.length; i++) {
    if (a[i] < min) { min = a[i]; iMin = i; }
    if (a[i] > max) { max = a[i]; iMax = i; }
    sum += a[i];
  }
  return { min, max, iMin, iMax, mean: sum / a.length };
}

function dayOf(iso: string): number {
  return Date.parse(iso.length === 10 ? `${iso}T00:00:00Z` : iso);
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
          out.add('OUT_OF_RANGE', i + 1, `Reading ${i + 1} of ${inst.id} is ${fmt(v)} ${ch.unit}, outside its range ${inst.range.min} to ${inst.range.max} ${ch.unit}; its specification does not hold there.`);
        }
      }
    }
    if (inst.dueDate && runDay > dayOf(inst.dueDate)) {
      out.add('OUT_OF_CALIBRATION', null, `${inst.id} was due for calibration on ${inst.dueDate}, before the run date ${doc.runDate}; its certificate no longer covers these readings.`);
    } else if (inst.calibrationDate && runDay < dayOf(inst.calibrationDate)) {
      out.add('OUT_OF_CALIBRATION', null, `${inst.id} was calibrated on ${inst.calibrationDate}, after the run date ${doc.runDate}; no certificate covers these readings.`);
    }
  }

  const rated = doc.apparatus?.ratedPressure;
  if (rated && series.P) {
    // Qwell reads a rating as absolute pressure, the conservative reading of a vessel plate.
    const ratedPa = toSi('pressure', rated.unit, rated.value);
    for (let i = 0; i < N; i++) {
      if (series.P.si[i] > ratedPa) out.add('ABOVE_RATED_PRESSURE', i + 1, `Reading ${i + 1} reaches ${fmt(series.P.si[i])} Pa, above the apparatus's rated ${fmt(ratedPa)} Pa; stay within the vessel's rating and the lab's safety review.`);
    }
  }

  const claimed = doc.process.claimed;
  if (claimed === 'isothermal') {
    const s = spanOf(series.T.si);
    if (s.max - s.min > ISOTHERMAL_DRIFT_FRACTION * s.mean) {
      const worst = Math.abs(series.T.si[s.iMax] - series.T.si[0]) > Math.abs(series.T.si[s.iMin] - series.T.si[0]) ? s.iMax : s.iMin;
      out.add('ISOTHERMAL_DRIFT', worst + 1, `The run is claimed isothermal but its temperature spans ${fmt(s.max - s.min)} K (more than ${ISOTHERMAL_DRIFT_FRACTION * 100} % of ${fmt(s.mean)} K), furthest from the start at reading ${worst + 1}.`);
    }
  }
  if (claimed === 'isochoric' && series.V) {
    const s = spanOf(series.V.si);
    if (s.max - s.min > ISOCHORIC_VOLUME_FRACTION * s.mean) {
      out.add('ISOCHORIC_VOLUME_CHANGE', s.iMax + 1, `The run is claimed isochoric but its volume spans ${fmt(s.max - s.min)} m³ (more than ${ISOCHORIC_VOLUME_FRACTION * 100} % of ${fmt(s.mean)} m³), largest at reading ${s.iMax + 1}.`);
    }
  }
  if (claimed === 'adiabatic' && ctx.electricalHeat !== 0 && Math.abs(ctx.electricalHeat) > ADIABATIC_HEAT_FRACTION * Math.abs(ctx.work)) {
    let iMax = 0;
    let pMax = -Infinity;
    for (let i = 0; i < N; i++) {
      const p = series.Pw ? series.Pw.si[i] : (series.U?.si[i] ?? 0) * (series.I?.si[i] ?? 0);
      if (p > pMax) { pMax = p; iMax = i; }
    }
    out.add('ADIABATIC_HEATER_POWER', iMax + 1, `The run is claimed adiabatic but the heater delivered ${fmt(ctx.electricalHeat)} J (peak ${fmt(pMax)} W at reading ${iMax + 1}), more than ${ADIABATIC_HEAT_FRACTION * 100} % of |W|.`);
  }
  if (ctx.fit && ctx.claimedIndex !== null && Number.isFinite(ctx.claimedIndex)) {
    const diff = Math.abs(ctx.fit.index - ctx.claimedIndex);
    if (diff > Math.max(3 * ctx.fit.uIndex, INDEX_ABS_TOLERANCE)) {
      out.add('INDEX_FAR_FROM_CLAIM', null, `The fitted polytropic index ${fmt(ctx.fit.index)} ± ${fmt(ctx.fit.uIndex)} is far from ${fmt(ctx.claimedIndex)}, the index a ${claimed} process implies (difference above 3 standard errors and ${INDEX_ABS_TOLERANCE}).`);
    }
  }
  out.summarise();
  return out.flags;
}
