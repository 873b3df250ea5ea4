// One sentence of why beside a verdict that breaks or is indeterminate, built from a stored result only,
// so that the run page, e-mails and the PDF report say the same thing. Not engine logic: it reads the
// engine's budget and hints and words them; it never re-evaluates anything.
import { correctionsClause, type AppliedCorrection } from '../../contract/corrections';
import type { Verdict } from '../../contract/runs';

/** The parts of a stored balance result the sentence reads (a subset of the engine's BalanceResult). */
export interface WhyInput {
  verdict: Verdict;
  En: number | null;
  residual: { r: number; u: number; U: number; k: number };
  indeterminateLimit: number;
  budget: readonly { group: string; contribution: number }[];
  hints: readonly { code: string; message: string; value?: number; alteredEn?: number }[];
  /** The certificates' corrections the check applied to the readings (absent in results stored before engine 2.3). */
  corrections?: readonly AppliedCorrection[];
}

/** Hints that name one recording slip whose correction makes the balance close. */
const CLOSING_HINTS = ['FORGOTTEN_HEAT_LEAK', 'GAUGE_AS_ABSOLUTE', 'ML_AS_L', 'CELSIUS_AS_KELVIN', 'CURRENT_UNIT', 'TEMPERATURE_OFFSET'];

/** A number as people read it: three significant figures, a true minus sign. */
function figure(x: number, digits = 3): string {
  const text = Number(x.toPrecision(digits)).toString();
  return text.replace(/^-/, '\u2212');
}

/** The budget's group with the largest share of u²(r), with that share (0..1). */
export function dominantSource(input: Pick<WhyInput, 'budget' | 'residual'>): { group: string; share: number } | null {
  const byGroup = new Map<string, number>();
  for (const line of input.budget) byGroup.set(line.group, (byGroup.get(line.group) ?? 0) + line.contribution);
  const variance = input.residual.u ** 2;
  let best: { group: string; share: number } | null = null;
  for (const [group, contribution] of byGroup) {
    if (!best || contribution > best.share * variance) best = { group, share: variance > 0 ? contribution / variance : 0 };
  }
  return best && variance > 0 ? best : null;
}

/** The hint that explains a breaking balance best: one that makes it close, the nearest to En = 1 below. */
function strongestHint(hints: WhyInput['hints']) {
  const closing = hints.filter((h) => CLOSING_HINTS.includes(h.code) && h.alteredEn !== undefined);
  closing.sort((a, b) => (a.alteredEn ?? 0) - (b.alteredEn ?? 0));
  return closing[0] ?? hints.find((h) => h.code === 'HEATER_CHANNEL_MISSING') ?? null;
}

function hintSentence(hint: NonNullable<ReturnType<typeof strongestHint>>): string {
  if (hint.code === 'FORGOTTEN_HEAT_LEAK' && hint.value !== undefined) {
    return `No heat leak was accounted for: a heat-loss coefficient h \u2248 ${figure(hint.value, 2)} W/K would close the balance.`;
  }
  return hint.message;
}

/**
 * Why a run breaks or is indeterminate, in one sentence (null when it closes): the strongest hint
 * when one explains a break, otherwise the dominant source of u(r) and its share; followed by a clause
 * naming the certificates whose corrections the check applied, when it applied any, since the verdict
 * is about the corrected readings, not the ones in the readings table.
 */
export function whySentence(result: WhyInput): string | null {
  const why = reasonOf(result);
  const corrected = correctionsClause(result.corrections);
  return why && corrected ? `${why} ${corrected}` : why;
}

function reasonOf(result: WhyInput): string | null {
  if (result.verdict === 'closes') return null;
  const source = dominantSource(result);
  const sourceWords = source ? `${source.group} (${figure(100 * source.share, 2)} % of u²(r))` : null;
  if (result.verdict === 'breaks') {
    const hint = strongestHint(result.hints);
    if (hint) return hintSentence(hint);
    const times = result.En === null ? '' : `, ${figure(result.En, 2)} times its expanded uncertainty U(r) = ${figure(result.residual.U, 2)} J`;
    return `ΔU and Q − W differ by r = ${figure(result.residual.r)} J${times}, and no common recording slip explains it${sourceWords ? `; the largest source of u(r) is ${sourceWords}` : ''}.`;
  }
  const halved = result.hints.find((h) => h.code === 'DOMINANT_SOURCE')?.value;
  const limit = `U(r) = ${figure(result.residual.U, 2)} J is wider than the lab's limit of ${figure(result.indeterminateLimit, 2)} J`;
  if (!sourceWords) return `${limit}, so the check cannot tell whether the balance closes.`;
  return `${limit}, mostly from ${sourceWords}${halved !== undefined ? `; halving that uncertainty would bring U(r) to ${figure(halved, 2)} J` : ''}.`;
}
