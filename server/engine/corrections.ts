// Calibration corrections: a certificate in force states corrected = reading × gain + offset, in the unit it
// gives them in. The check applies it to every reading of the instrument before the SI conversion, so that
// the result is corrected for the recognised systematic effect whose uncertainty the certificate's U states
// (GUM, JCGM 100:2008 §3.2.3–3.2.4; the U enters the budget as before, instrument-uncertainty.ts).
import type { AppliedCorrection, CorrectedReading } from '../../contract/corrections';
import type { Instrument } from './run-document';
import { affineToSi, type UnitKind } from './units';

/** A certificate's correction as a run document states it (`calibration.correction` of an instrument). */
export interface CertificateCorrection {
  /** The certificate's number, for the record. */
  certificate?: string;
  /** Default 1. */
  gain?: number;
  /** Default 0, in `unit`. */
  offset?: number;
  /** The unit the certificate states the correction in; default the unit of the channel the instrument reads. */
  unit?: string;
}

/** A correction as the engine applies it: y' = gain·y + offset in the channel's unit, and what the result records. */
export interface ChannelCorrection {
  gain: number;
  offset: number;
  applied: AppliedCorrection;
}

/** A date or date-time as ms since 1970 (a bare date is its UTC midnight). */
export function dayOf(iso: string): number {
  return Date.parse(iso.length === 10 ? `${iso}T00:00:00Z` : iso);
}

/** Whether the instrument's certificate covers a run date: due before it, made after it, or in force (or undated). */
export function certificateStatus(inst: Pick<Instrument, 'calibrationDate' | 'dueDate'>, runDate: string): 'expired' | 'not-yet' | 'in-force' {
  const runDay = dayOf(runDate);
  if (inst.dueDate && runDay > dayOf(inst.dueDate)) return 'expired';
  if (inst.calibrationDate && runDay < dayOf(inst.calibrationDate)) return 'not-yet';
  return 'in-force';
}

/** The correction an instrument's certificate states, when it states one that changes anything. */
export function statedCorrection(inst: Instrument | undefined): CertificateCorrection | null {
  const c = inst?.calibration?.correction;
  if (!c) return null;
  const gain = c.gain ?? 1;
  const offset = c.offset ?? 0;
  return gain === 1 && offset === 0 ? null : c;
}

/**
 * The correction of the instrument behind a channel, in the channel's unit, or null: none stated, a gain of 1
 * with an offset of 0, or a certificate not in force on the run date (its correction does not describe the
 * instrument then). A correction stated in another unit of the same kind is carried over exactly: with
 * SI = a·x + b in each unit, x' = g·x + o in the certificate's unit is y' = g·y + ((1 − g)(b_c − b_y) + a_c·o)/a_y
 * in the channel's (the gain is the same in every unit; only °C, °F and K have b ≠ 0).
 */
export function correctionFor(inst: Instrument | undefined, reading: CorrectedReading, kind: UnitKind, channelUnit: string, runDate: string): ChannelCorrection | null {
  const stated = statedCorrection(inst);
  if (!inst || !stated || certificateStatus(inst, runDate) !== 'in-force') return null;
  const gain = stated.gain ?? 1;
  const o = stated.offset ?? 0;
  const unit = stated.unit ?? channelUnit;
  let offset = o;
  if (unit !== channelUnit) {
    const cert = affineToSi(kind, unit);
    const chan = affineToSi(kind, channelUnit);
    offset = ((1 - gain) * (cert.offset - chan.offset) + cert.factor * o) / chan.factor;
  }
  return {
    gain,
    offset,
    applied: { reading, instrument: inst.id, instrumentName: inst.name ?? null, certificate: stated.certificate ?? null, gain, offset: o, unit },
  };
}

/** The readings as the check reads them: each entered value × gain + offset (a new array; the entered ones are kept). */
export function correctedValues(values: ArrayLike<number>, c: ChannelCorrection): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = values[i] * c.gain + c.offset;
  return out;
}
