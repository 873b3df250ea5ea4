import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { checkRunDocument, type BalanceResult } from '../server/engine/balance';
import type { RunDocument } from '../server/engine';

export function loadFixture(name: string): RunDocument {
  return JSON.parse(readFileSync(join(__dirname, '..', 'fixtures', 'runs', `${name}.json`), 'utf8')) as RunDocument;
}

/** The engine's result for a run document, or the document's errors thrown as they are: for the engine specs. */
export function checkedResult(doc: unknown, draws = 2000): BalanceResult {
  const res = checkRunDocument(doc, { draws, seed: 1 });
  if (!res.ok) throw new Error(JSON.stringify(res.errors));
  return res.result;
}

/** The bodies a client sends to create a run from a run document: POST /api/runs, then PUT readings. */
export function runBodies(doc: RunDocument, projectId: number) {
  const { time, ...channels } = doc.readings as unknown as Record<string, { unit: string; values: number[]; instrument?: string; reference?: string }> & { time: { unit: 's'; values: number[] } };
  return {
    create: {
      projectId,
      title: doc.title ?? 'untitled',
      process: doc.process.claimed,
      runDate: doc.runDate,
      setup: { gas: doc.gas, amount: doc.amount, processIndex: doc.process.index, ambient: doc.ambient, apparatus: doc.apparatus, instruments: doc.instruments },
    },
    readings: { time, channels },
  };
}
