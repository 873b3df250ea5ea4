import { CHANNEL_LABELS } from './channels';
import { unitSymbol } from './units';

// Corrections a calibration certificate states for an instrument, as the balance check applied them to
// the readings (GUM, JCGM 100:2008 §3.2.3–3.2.4: a result is corrected for every recognised significant
// systematic effect; the certificate's U covers the uncertainty of that correction). The readings as
// stored stay as the bench entered them; the check reads each as reading × gain + offset.

/** What a correction was applied to: a reading channel, or the barometric pressure of the run. */
export type CorrectedReading = 'pressure' | 'volume' | 'displacement' | 'temperature' | 'voltage' | 'current' | 'power' | 'ambientPressure';

/** One certificate's correction as a result records it: corrected = reading × gain + offset, in `unit`. */
export interface AppliedCorrection {
  reading: CorrectedReading;
  /** The instrument's tag (or its id in a run document) and name. */
  instrument: string;
  instrumentName: string | null;
  /** The certificate stating the correction; null when a run document did not name it. */
  certificate: string | null;
  gain: number;
  /** In `unit`, the unit the certificate states the correction in (the instrument's own). */
  offset: number;
  unit: string;
}

/** The headings of the corrected readings, as a sentence names them. */
export const CORRECTED_READING_LABELS: Readonly<Record<CorrectedReading, string>> = {
  pressure: `${CHANNEL_LABELS.pressure} readings`,
  volume: `${CHANNEL_LABELS.volume} readings`,
  displacement: `${CHANNEL_LABELS.displacement} readings`,
  temperature: `${CHANNEL_LABELS.temperature} readings`,
  voltage: `${CHANNEL_LABELS.voltage} readings`,
  current: `${CHANNEL_LABELS.current} readings`,
  power: `${CHANNEL_LABELS.power} readings`,
  ambientPressure: 'Barometric pressure',
};

/** The correction as a formula in the lab's units, e.g. "× 1.0004 − 0.05 °C" (a gain of 1 or an offset of 0 is left out). */
export function correctionFormula(c: Pick<AppliedCorrection, 'gain' | 'offset' | 'unit'>): string {
  const parts: string[] = [];
  if (c.gain !== 1) parts.push(`× ${c.gain}`);
  if (c.offset !== 0) parts.push(`${c.offset < 0 ? '−' : '+'} ${Math.abs(c.offset)} ${unitSymbol(c.unit)}`);
  return parts.length ? parts.join(' ') : 'none';
}

/** One sentence per applied correction, e.g. "Temperature readings corrected by certificate TC-2026-014 of TC-9: × 1.0004 − 0.05 °C". */
export function correctionSentence(c: AppliedCorrection): string {
  const source = c.certificate ? `certificate ${c.certificate} of ${c.instrument}` : `the calibration of ${c.instrument}`;
  return `${CORRECTED_READING_LABELS[c.reading]} corrected by ${source}: ${correctionFormula(c)}.`;
}

/** "a", "a and b", "a, b and c". */
function listed(items: readonly string[]): string {
  return items.length < 2 ? items.join('') : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

/**
 * One clause naming the certificates whose corrections the check applied, for the sentence of why beside a verdict
 * and the mail about it, e.g. "Readings corrected by certificate HGT-CAL-2026-118 (TC-9) before the check."; null
 * when none was applied. Each certificate is named once, however many readings it corrected.
 */
export function correctionsClause(corrections: readonly AppliedCorrection[] | undefined): string | null {
  if (!corrections?.length) return null;
  const certificates = [...new Set(corrections.filter((c) => c.certificate).map((c) => `${c.certificate} (${c.instrument})`))];
  const unnamed = [...new Set(corrections.filter((c) => !c.certificate).map((c) => c.instrument))];
  const sources: string[] = [];
  if (certificates.length) sources.push(`${certificates.length === 1 ? 'certificate' : 'certificates'} ${listed(certificates)}`);
  if (unnamed.length) sources.push(`the calibration of ${listed(unnamed)}`);
  return `Readings corrected by ${listed(sources)} before the check.`;
}
