import type { BalanceResult } from '../engine';

/** What a stored result says about readings above the vessel's rated pressure, or null when none were. */
export interface OverPressure {
  /** How many readings went above the rating (the engine lists the first few and counts the rest). */
  readings: number;
  /** The first such reading in the engine's words (kPa, absolute or gauge), without its closing advice. */
  first: string;
}

export function overPressureOf(result: Pick<BalanceResult, 'flags'>): OverPressure | null {
  const over = result.flags.filter((f) => f.code === 'ABOVE_RATED_PRESSURE');
  if (over.length === 0) return null;
  const readings = over.reduce((n, f) => n + (f.reading !== null ? 1 : (f.more ?? 0)), 0);
  const first = over[0].message.split(';')[0].trim();
  return { readings, first: first.endsWith('.') ? first : `${first}.` };
}

/** The safety mail's text: plain words, kPa, and the lab's own practice first. */
export function overPressureMail(run: { code: string; title: string }, over: OverPressure, link: string): { subject: string; body: string } {
  const count = over.readings === 1 ? 'One reading' : `${over.readings} readings`;
  return {
    subject: `Safety: run ${run.code} went above its vessel's rated pressure`,
    body: [
      `${count} of run ${run.code} "${run.title}" went above the rated pressure of its vessel. ${over.first}`,
      'Make the vessel safe and do not pressurise it again until it has been inspected; report the event as the lab\'s safety practice requires. Local codes and the lab\'s licensed safety practice take precedence over anything Qwell shows.',
      `Open the run: ${link}`,
    ].join('\n\n'),
  };
}
