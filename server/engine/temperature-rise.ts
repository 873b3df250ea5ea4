// The corrected temperature rise of a calorimetric run: fore-, main- and after-period, and the rise the
// calorimeter would have shown without heat exchange with its surroundings, by two published methods.
//
// Regnault–Pfaundler (ISO 1928 and ASTM D240 describe it; the form here from memory): the drift is linear in
// temperature, g(T) = g₀ − k·(T − T_ref), with k and g₀ from Newton's law fitted to the outer periods
// (drift-fit.ts), and ΔT_c = T(t_e) − T(t_s) − ∫ g(T) dt over the main period (trapezoidal rule on the
// readings). Exact for Newton's law up to the trapezoid's error.
// Dickinson's extrapolation (Bull. Bur. Stand. 11, 1915; the formula as ASTM D240 writes it, from memory): the
// fore- and after-drift lines are extrapolated to the time b at which the rise reached 60 % of its total,
// ΔT_c = t_c − t_a − r₁·(b − a) − r₂·(c − b).
import { convergenceTemperature, fitNewton, linearDrift, newtonDrift, type LinearDrift, type NewtonFit } from './drift-fit';

export type RiseMethod = 'regnault-pfaundler' | 'dickinson';
export const RISE_METHODS: readonly RiseMethod[] = ['regnault-pfaundler', 'dickinson'];

/** Fraction of the observed rise at which Dickinson's time b is taken (ASTM D240, from memory). */
export const DICKINSON_FRACTION = 0.6;
/** Period detection: the main period holds the intervals whose rate departs from the outer drift by this share of the peak rate. */
export const DETECTION_SHARE = 0.05;
/** Each outer period needs at least this many readings to fit a drift. */
export const MIN_OUTER_READINGS = 3;

export interface Periods {
  /** Reading indices (0-based) where the main period starts and ends. */
  iStart: number;
  iEnd: number;
  source: 'document' | 'detected';
}

export interface ValueU { value: number; u: number }

export interface TemperatureRise {
  /** T(t_e) − T(t_s) over the main period, K. */
  observed: number;
  corrected: ValueU;
  method: RiseMethod;
  alternative: ValueU & { method: RiseMethod };
  periods: {
    source: 'document' | 'detected';
    /** Seconds on the run's time axis, and 1-based reading numbers. */
    mainStart: number; mainEnd: number; startReading: number; endReading: number;
    foreReadings: number; afterReadings: number;
    /** Dickinson's time b, s. */
    dickinsonTime: number;
  };
  drift: { fore: DriftOut; after: DriftOut };
  /** Both corrected rises (for flags and screens), u from the drift fits and the reading scatter alone. */
  regnaultPfaundler: ValueU;
  dickinson: ValueU;
  /**
   * The parts of u(corrected), K: the drift fits and reading scatter of the method used, and the thermometer's gain
   * (a relative gain g scales every temperature difference, so ∂ΔT_c/∂g = ΔT_c). An offset common to all readings
   * (a calibration certificate's U read as an offset, as the balance reads it) cancels in a rise.
   */
  uncertainty: { fit: number; thermometerGain: number; thermometer: string | null };
}

export interface DriftOut { rate: number; u: number; meanTemperature: number; meanTime: number; readings: number }

export interface RiseAnalysis {
  rise: TemperatureRise;
  newton: NewtonFit;
}

export class PeriodError extends Error {}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m]);
};

/**
 * Finds the main period: the windows around the steepest one whose rate departs from the outer drift by more
 * than DETECTION_SHARE of the peak's departure. Rates are taken over windows of about N/60 readings so that a
 * thermometer's resolution steps do not look like heating. Throws PeriodError with the reason when it cannot.
 */
export function detectPeriods(t: ArrayLike<number>, T: ArrayLike<number>): Periods {
  const N = T.length;
  const w = Math.max(1, Math.round(N / 60));
  const rates: number[] = [];
  for (let i = 0; i + w < N; i++) rates.push((T[i + w] - T[i]) / (t[i + w] - t[i]));
  let p = 0;
  for (let i = 1; i < rates.length; i++) if (Math.abs(rates[i]) > Math.abs(rates[p])) p = i;
  // The heating spans the windows whose rate is at least half the peak's (a plateau for steady electrical heating).
  let a = p, b = p;
  while (a > 0 && Math.abs(rates[a - 1]) >= 0.5 * Math.abs(rates[p])) a--;
  while (b + 1 < rates.length && Math.abs(rates[b + 1]) >= 0.5 * Math.abs(rates[p])) b++;
  const fore = median(rates.slice(0, Math.max(1, Math.floor(a / 2))));
  const after = median(rates.slice(b + 1 + Math.floor((rates.length - b - 1) / 2)));
  // A window counted as steady may still hold DETECTION_SHARE·w heated steps at its inner end: widen by that margin
  // (a main period wider than the heating is harmless, a heated reading in an outer period is not).
  const margin = Math.ceil(DETECTION_SHARE * w);
  let iStart = -1;
  for (let i = a - 1; i >= 0; i--) {
    if (Math.abs(rates[i] - fore) <= DETECTION_SHARE * Math.abs(rates[p] - fore)) { iStart = Math.max(0, i + w - margin); break; }
  }
  let iEnd = -1;
  for (let j = b + 1; j < rates.length; j++) {
    if (Math.abs(rates[j] - after) <= DETECTION_SHARE * Math.abs(rates[p] - after)) { iEnd = Math.min(N - 1, j + margin); break; }
  }
  if (iStart < 0) throw new PeriodError('no steady fore-period was found before the steepest change of temperature');
  if (iEnd < 0) throw new PeriodError('no steady after-period was found after the steepest change of temperature');
  return { iStart, iEnd, source: 'detected' };
}

/** The main period from the document's times (seconds on the run's axis): the readings at or inside them. */
export function periodsFromTimes(t: ArrayLike<number>, mainStart: number, mainEnd: number): Periods {
  const N = t.length;
  const eps = 1e-9 * Math.max(1, Math.abs(t[N - 1]));
  let iStart = 0;
  while (iStart < N && t[iStart] < mainStart - eps) iStart++;
  let iEnd = N - 1;
  while (iEnd > 0 && t[iEnd] > mainEnd + eps) iEnd--;
  return { iStart, iEnd, source: 'document' };
}

const driftOut = (d: LinearDrift): DriftOut => ({ rate: d.rate, u: d.uRate, meanTemperature: d.meanTemperature, meanTime: d.meanTime, readings: d.readings });

/** Regnault–Pfaundler corrected rise over readings [s, e] with the Newton drift, and its standard uncertainty. */
export function regnaultPfaundler(t: ArrayLike<number>, T: ArrayLike<number>, s: number, e: number, fit: NewtonFit, readingScatter: number): ValueU {
  let L = 0, I = 0, corr = 0;
  for (let i = s; i < e; i++) {
    const dt = t[i + 1] - t[i];
    L += dt;
    I += 0.5 * (T[i] + T[i + 1] - 2 * fit.Tref) * dt; // ∫(T − T_ref) dt
    corr += 0.5 * (newtonDrift(fit, T[i]) + newtonDrift(fit, T[i + 1])) * dt; // ∫g(T) dt
  }
  const value = T[e] - T[s] - corr;
  // corr = g₀·L − k·I ⇒ ∂/∂k = −I, ∂/∂g₀ = L; the two end readings add their scatter (GUM 5.2.2).
  const c = fit.covariance;
  const u2 = I * I * c[0][0] + L * L * c[1][1] - 2 * I * L * c[0][1] + 2 * readingScatter * readingScatter;
  return { value, u: Math.sqrt(Math.max(0, u2)) };
}

/** Dickinson's extrapolation; returns the corrected rise and the time b. */
export function dickinson(t: ArrayLike<number>, T: ArrayLike<number>, s: number, e: number, fore: LinearDrift, after: LinearDrift, readingScatter: number): ValueU & { b: number } {
  const target = T[s] + DICKINSON_FRACTION * (T[e] - T[s]);
  const up = T[e] >= T[s];
  let b = t[e];
  for (let i = s; i < e; i++) {
    const reached = up ? T[i + 1] >= target : T[i + 1] <= target;
    if (reached) {
      const f = T[i + 1] === T[i] ? 1 : (target - T[i]) / (T[i + 1] - T[i]);
      b = t[i] + f * (t[i + 1] - t[i]);
      break;
    }
  }
  const a = t[s], c = t[e];
  const value = T[e] - T[s] - fore.rate * (b - a) - after.rate * (c - b);
  const u2 = (b - a) ** 2 * fore.uRate ** 2 + (c - b) ** 2 * after.uRate ** 2 + 2 * readingScatter * readingScatter;
  return { value, u: Math.sqrt(u2), b };
}

/** Periods, drifts, Newton fit and both corrected rises; throws PeriodError when the record cannot give them. */
export function analyseRise(t: ArrayLike<number>, T: ArrayLike<number>, method: RiseMethod, given?: { mainStart: number; mainEnd: number }): RiseAnalysis {
  const N = T.length;
  const periods = given ? periodsFromTimes(t, given.mainStart, given.mainEnd) : detectPeriods(t, T);
  const { iStart: s, iEnd: e } = periods;
  if (!(e > s)) throw new PeriodError('the main period holds no interval between readings');
  if (s + 1 < MIN_OUTER_READINGS) throw new PeriodError(`the fore-period has ${s + 1} reading(s); at least ${MIN_OUTER_READINGS} are needed to fit its drift`);
  if (N - e < MIN_OUTER_READINGS) throw new PeriodError(`the after-period has ${N - e} reading(s); at least ${MIN_OUTER_READINGS} are needed to fit its drift`);
  const fore = linearDrift(t, T, 0, s);
  const after = linearDrift(t, T, e, N - 1);
  const newton = fitNewton(t, T, s, e);
  if (!newton) throw new PeriodError('Newton\'s law could not be fitted to the fore- and after-period');
  const scatter = newton.scatter;
  const rp = regnaultPfaundler(t, T, s, e, newton, scatter);
  const dk = dickinson(t, T, s, e, fore, after, scatter);
  const chosen = method === 'dickinson' ? dk : rp;
  const other = method === 'dickinson' ? { value: rp.value, u: rp.u, method: 'regnault-pfaundler' as const } : { value: dk.value, u: dk.u, method: 'dickinson' as const };
  return {
    newton,
    rise: {
      observed: T[e] - T[s],
      corrected: { value: chosen.value, u: chosen.u },
      method,
      alternative: other,
      periods: {
        source: periods.source, mainStart: t[s], mainEnd: t[e], startReading: s + 1, endReading: e + 1,
        foreReadings: s + 1, afterReadings: N - e, dickinsonTime: dk.b,
      },
      drift: { fore: driftOut(fore), after: driftOut(after) },
      regnaultPfaundler: rp,
      dickinson: { value: dk.value, u: dk.u },
      uncertainty: { fit: chosen.u, thermometerGain: 0, thermometer: null },
    },
  };
}

/**
 * Adds the thermometer's relative gain uncertainty (GUM 4.3.7 from its ± % of reading) to both corrected rises:
 * u² = u_fit² + (g·ΔT_c)² (GUM 5.1.2; the gain is independent of the drift fits).
 */
export function withThermometerGain(rise: TemperatureRise, relativeGainU: number, thermometer: string | null): TemperatureRise {
  const part = (v: ValueU) => Math.abs(v.value) * relativeGainU;
  return {
    ...rise,
    corrected: { value: rise.corrected.value, u: Math.hypot(rise.corrected.u, part(rise.corrected)) },
    alternative: { ...rise.alternative, u: Math.hypot(rise.alternative.u, part(rise.alternative)) },
    uncertainty: { fit: rise.uncertainty.fit, thermometerGain: part(rise.corrected), thermometer },
  };
}

export { convergenceTemperature };
