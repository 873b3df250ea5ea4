// Splits an instrument specification into systematic parts (shared by every reading of the run) and a
// random part (independent per reading), as GUM 4.3 Type B evaluations.
import type { CertificateCorrection } from './corrections';

export interface InstrumentSpec {
  /** ± % of reading: half-width of a rectangular distribution. */
  percentOfReading?: number;
  /** ± % of full scale, with the full scale in the channel's unit. */
  percentOfFullScale?: number;
  fullScale?: number;
  /** Smallest displayed step, in the channel's unit. */
  resolution?: number;
  /** Standard deviation of repeated readings (Type A, known from the instrument's history), channel unit. */
  repeatability?: number;
  /**
   * Calibration certificate: expanded uncertainty U (channel unit) with its coverage factor k, and the correction
   * it states (reading × gain + offset), which the check applies to the readings (corrections.ts).
   */
  calibration?: { U: number; k: number; correction?: CertificateCorrection };
}

export interface UncertaintyComponents {
  /** Relative standard uncertainty of a common gain (from % of reading). */
  gain: number;
  /** Standard uncertainty of a common offset from % of full scale, channel unit. */
  fullScaleOffset: number;
  /** Standard uncertainty of a common offset from the calibration certificate, channel unit. */
  calibrationOffset: number;
  /** Per-reading standard uncertainty, channel unit. */
  random: number;
  /** Rectangular when resolution alone makes up the random part. */
  randomDistribution: 'normal' | 'rectangular';
}

const SQRT3 = Math.sqrt(3);
const SQRT12 = Math.sqrt(12);

export function components(spec: InstrumentSpec): UncertaintyComponents {
  // % of reading is treated as a gain error common to the whole run (a transducer's span error does not
  // change between readings); treating it as random would shrink it by √N and overstate the confidence.
  const gain = (spec.percentOfReading ?? 0) / 100 / SQRT3; // rectangular: a/√3 (GUM 4.3.7)
  const fullScaleOffset = ((spec.percentOfFullScale ?? 0) / 100) * (spec.fullScale ?? 0) / SQRT3; // zero error, a/√3
  const calibrationOffset = spec.calibration ? spec.calibration.U / spec.calibration.k : 0; // u = U/k (GUM 7.2.3)
  const res = (spec.resolution ?? 0) / SQRT12; // rectangular of full width δx: δx/√12 (GUM F.2.2.1)
  const rep = spec.repeatability ?? 0;
  return {
    gain,
    fullScaleOffset,
    calibrationOffset,
    random: Math.sqrt(res * res + rep * rep),
    randomDistribution: rep === 0 ? 'rectangular' : 'normal',
  };
}
