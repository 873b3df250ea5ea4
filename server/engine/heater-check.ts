// Heater consistency: a heater's voltage and current come together, and its resistance U/I holds steady within
// what the meters can tell apart. A current with no voltage (or the reverse) or a resistance that wanders points at
// a channel read from the wrong input; this names it, as a flag and a hint.
import type { ChannelSeries, RunSeries } from './series';

export interface HeaterFinding {
  code: 'HEATER_CURRENT_WITHOUT_VOLTAGE' | 'HEATER_VOLTAGE_WITHOUT_CURRENT' | 'HEATER_RESISTANCE_UNSTEADY';
  /** 1-based reading, or null for the whole run. */
  reading: number | null;
  message: string;
  /** The likely wrong channel, in the lab's words. */
  hint: string;
}

export interface HeaterSettings {
  /** How many standard uncertainties a reading must clear to count as non-zero, or a spread to count as real. */
  coverage: number;
  /** A heater's resistance may drift this fraction with its temperature before it is questioned. */
  resistanceTolerance: number;
}

/**
 * Readings in a row that must show current without voltage (or the reverse) before it is flagged: one noisy
 * reading beyond k standard uncertainties is expected among hundreds, three in a row are not (p³).
 */
const MIN_RUN = 3;
/** Most blocks the on-period is cut into; block means average the per-reading noise down (√m). */
const BLOCKS = 20;

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}

/** Standard uncertainty of one reading at zero (offsets and the per-reading part), SI. */
function zeroU(ch: ChannelSeries): number {
  const k = ch.comps;
  return ch.factor * Math.hypot(k.fullScaleOffset, k.calibrationOffset, k.random);
}

interface Block { mean: number; U: number; I: number }

export function heaterFindings(series: RunSeries, settings: HeaterSettings): HeaterFinding[] {
  const { U, I, N } = series;
  if (!U || !I) return [];
  const k = settings.coverage;
  const uU0 = zeroU(U), uI0 = zeroU(I);
  const findings: HeaterFinding[] = [];
  let iOnly = 0, uOnly = 0, firstI = -1, firstU = -1, runI = 0, runU = 0;
  let on = 0;
  for (let i = 0; i < N; i++) {
    const u = Math.abs(U.si[i]) > k * uU0, c = Math.abs(I.si[i]) > k * uI0;
    runI = c && !u ? runI + 1 : 0;
    runU = u && !c ? runU + 1 : 0;
    if (runI >= MIN_RUN) { iOnly += runI === MIN_RUN ? MIN_RUN : 1; if (firstI < 0) firstI = i - MIN_RUN + 1; }
    if (runU >= MIN_RUN) { uOnly += runU === MIN_RUN ? MIN_RUN : 1; if (firstU < 0) firstU = i - MIN_RUN + 1; }
    if (u && c) on++;
  }
  if (iOnly > 0) {
    findings.push({ code: 'HEATER_CURRENT_WITHOUT_VOLTAGE', reading: firstI + 1,
      message: `At ${iOnly} reading(s) in runs of ${MIN_RUN} or more, first reading ${firstI + 1}, the heater current is ${fmt(I.si[firstI])} A while its voltage reads ${fmt(U.si[firstI])} V, within ${k} standard uncertainties (${fmt(k * uU0)} V) of zero: current cannot flow through the heater with no voltage across it.`,
      hint: 'The voltage channel is likely read from the wrong input (or the current from another circuit): check which logger channel the heater voltmeter feeds.' });
  }
  if (uOnly > 0) {
    findings.push({ code: 'HEATER_VOLTAGE_WITHOUT_CURRENT', reading: firstU + 1,
      message: `At ${uOnly} reading(s) in runs of ${MIN_RUN} or more, first reading ${firstU + 1}, the heater voltage is ${fmt(U.si[firstU])} V while its current reads ${fmt(I.si[firstU])} A, within ${k} standard uncertainties (${fmt(k * uI0)} A) of zero: a heater with voltage across it carries current.`,
      hint: 'The current channel is likely read from the wrong input (or the heater circuit was open): check which logger channel the ammeter feeds.' });
  }
  if (on < 2) return findings;

  // Resistance R = U/I over the on-readings, in up to BLOCKS consecutive blocks.
  const m = Math.max(1, Math.floor(on / BLOCKS));
  const blocks: Block[] = [];
  let sR = 0, sU = 0, sI = 0, uR2 = 0, count = 0;
  const kU = U.comps, kI = I.comps;
  const uUr = kU.random * U.factor, uIr = kI.random * I.factor;
  for (let i = 0; i < N; i++) {
    const u = U.si[i], c = I.si[i];
    if (!(Math.abs(u) > k * uU0 && Math.abs(c) > k * uI0)) continue;
    const R = u / c;
    sR += R; sU += u; sI += c; count++;
    uR2 += R * R * ((uUr / u) ** 2 + (uIr / c) ** 2); // random part of u(R_i), GUM 5.1.6 for a quotient
    if (count === m) {
      blocks.push({ mean: sR / m, U: sU / m, I: sI / m });
      sR = sU = sI = 0; count = 0;
    }
  }
  if (blocks.length < 2) return findings;
  // u of a block mean: the random part averages down by √m, each meter's offsets do not (they shift R by b/I).
  const meanBlock = blocks.reduce((s, b) => s + b.mean, 0) / blocks.length;
  const meanU = blocks.reduce((s, b) => s + b.U, 0) / blocks.length;
  const meanI = blocks.reduce((s, b) => s + b.I, 0) / blocks.length;
  const uOffU = U.factor * Math.hypot(kU.fullScaleOffset, kU.calibrationOffset);
  const uOffI = I.factor * Math.hypot(kI.fullScaleOffset, kI.calibrationOffset);
  const uBlock = Math.sqrt(uR2 / (on * m) + (meanBlock * uOffU / meanU) ** 2 + (meanBlock * uOffI / meanI) ** 2);
  let lo = blocks[0], hi = blocks[0];
  for (const b of blocks) {
    if (b.mean < lo.mean) lo = b;
    if (b.mean > hi.mean) hi = b;
  }
  const span = hi.mean - lo.mean;
  const allowed = Math.max(k * Math.SQRT2 * uBlock, settings.resistanceTolerance * Math.abs(meanBlock));
  if (span > allowed) {
    // The channel that changes more between the two blocks, relative to its level, is the suspect.
    const relU = Math.abs(hi.U - lo.U) / Math.abs(meanU), relI = Math.abs(hi.I - lo.I) / Math.abs(meanI);
    const suspect = relI > relU ? 'current' : 'voltage';
    findings.push({ code: 'HEATER_RESISTANCE_UNSTEADY', reading: null,
      message: `The heater resistance U/I wanders from ${fmt(lo.mean)} Ω to ${fmt(hi.mean)} Ω during the run (block means of ${m} reading(s)), more than ${fmt(allowed)} Ω, the larger of ${k}·√2 propagated standard uncertainties and ${settings.resistanceTolerance * 100} % for the heater's own temperature drift.`,
      hint: `The ${suspect} channel changes by ${fmt(100 * (suspect === 'current' ? relI : relU))} % between those blocks while the ${suspect === 'current' ? 'voltage' : 'current'} changes by ${fmt(100 * (suspect === 'current' ? relU : relI))} %: the ${suspect} is likely read from the wrong channel.` });
  }
  return findings;
}
