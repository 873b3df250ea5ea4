// What a draft still lacks before it can be submitted, in the entry form's own words. The engine's
// validation speaks run-document paths ("apparatus.heatCapacity is required for gas.model
// "calorimeter""); people fill in a form, so each problem is named after the form's field.
import { count, eq } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { readings } from '../../db/schema';
import { validateRunDocument } from '../engine';
import type { SessionPerson } from '../core/session';
import { loadVisibleRun, type RunRow } from './run-access';
import { loadRunDocument } from './run-loader';

/** One thing still missing or wrong, pointing at the form field (`field` keeps the document path). */
export interface ChecklistItem {
  field: string;
  /** The form field's label, e.g. "Gas". */
  label: string;
  message: string;
}

/** The form's fields, by the first part of the run-document path the engine names. */
const FIELD_LABELS: Readonly<Record<string, string>> = {
  title: 'Title', runDate: 'Run date', process: 'Process', gas: 'Gas', amount: 'Amount of gas', ambient: 'Ambient conditions',
  apparatus: 'Apparatus', instruments: 'Instruments', readings: 'Readings', settings: 'Settings',
};

const CHANNEL_WORDS: Readonly<Record<string, string>> = {
  time: 'time', pressure: 'pressure', volume: 'volume', displacement: 'piston displacement', temperature: 'temperature',
  voltage: 'heater voltage', current: 'heater current', power: 'heater power',
};

/** The engine's problem, said as the form would say it. */
export function plainProblem(path: string, message: string, hasGas: boolean, readingCount: number): ChecklistItem {
  const top = path.split(/[.[]/)[0];
  const label = FIELD_LABELS[top] ?? top;
  // With no gas chosen the document falls back to a calorimeter run, which then asks for a heat capacity.
  if (!hasGas && (path.startsWith('apparatus.heatCapacity') || /gas\.model "calorimeter"/.test(message))) {
    return { field: 'gas', label: 'Gas', message: 'Choose the gas, or an apparatus with a measured heat capacity for a calorimeter run.' };
  }
  if (path === 'gas' || path.startsWith('gas.')) return { field: path, label, message: 'Choose the gas.' };
  if (path.startsWith('amount')) return { field: path, label, message: 'Give the amount of gas (moles or mass), or the initial pressure, volume and temperature it follows from.' };
  if (path.startsWith('ambient.pressure')) return { field: path, label: 'Ambient pressure', message: 'Give the barometric (ambient) pressure: gauge pressure needs it to become absolute.' };
  if (path.startsWith('ambient.temperature')) return { field: path, label: 'Ambient temperature', message: 'Give the room (ambient) temperature.' };
  if (path.startsWith('process.index')) return { field: path, label: 'Polytropic index', message: 'Give the polytropic index n of the claimed process.' };
  if (top === 'readings') {
    if (readingCount === 0) return { field: 'readings', label, message: 'Enter or import the readings: this draft has none yet.' };
    const channel = /^readings\.(\w+)/.exec(path)?.[1];
    const index = /\[(\d+)\]/.exec(path)?.[1];
    const column = channel ? `${CHANNEL_WORDS[channel] ?? channel} column` : 'readings';
    const where = index !== undefined ? `Reading ${Number(index) + 1} of the ${column}` : `The ${column}`;
    return { field: path, label, message: sentence(`${where} ${message.trim()}`) };
  }
  return { field: path, label, message: sentence(`The ${pathWords(path)} ${message.trim()}`) };
}

/** `apparatus.heatCapacity` → "apparatus heat capacity". */
function pathWords(path: string): string {
  return path.replace(/\[(\d+)\]/g, (_, i: string) => ` ${Number(i) + 1}`).split('.').map((part) => part.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase()).join(' ');
}

function sentence(text: string): string {
  const article = text.replace(/\ba (?=[aeiou])/g, 'an ');
  return /[.!?]$/.test(article) ? article : `${article}.`;
}

/** The problems that would stop a submit, de-duplicated by what they say. */
export async function submitProblems(db: DbOrTx, run: RunRow, labName: string, readingCount: number): Promise<ChecklistItem[]> {
  const doc = await loadRunDocument(db, run, labName);
  const valid = validateRunDocument(doc);
  if (valid.ok) return [];
  const setup = (run.setup ?? {}) as { gas?: unknown };
  const hasGas = Boolean(setup.gas || run.gasId);
  const seen = new Set<string>();
  const items: ChecklistItem[] = [];
  for (const e of valid.errors) {
    const item = plainProblem(e.path, e.message, hasGas, readingCount);
    if (!seen.has(item.message)) {
      seen.add(item.message);
      items.push(item);
    }
  }
  return items;
}

/** `GET /api/runs/:id/checklist`: what is still missing before submit, changing nothing. */
export async function runChecklist(db: DbOrTx, person: SessionPerson, id: number, labName: string, readingCount: (runId: number) => Promise<number>) {
  const run = await loadVisibleRun(db, person, id);
  const missing = await submitProblems(db, run, labName, await readingCount(id));
  return { runId: id, version: run.version, complete: missing.length === 0, missing };
}

export async function countReadings(db: DbOrTx, runId: number): Promise<number> {
  const [{ n }] = await db.select({ n: count() }).from(readings).where(eq(readings.runId, runId));
  return n;
}
