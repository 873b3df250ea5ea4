import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { checkRunDocument, type BalanceSettings } from '../engine';

type CheckResult = ReturnType<typeof checkRunDocument>;

/** From this many time points on, a stateless check runs in a worker thread, not on the event loop. */
export const OFF_THREAD_FROM_READINGS = 20_000;

// The worker loads the engine's TypeScript through tsx's require hook, as the server itself runs.
const WORKER_SOURCE = `
require('tsx/cjs');
const { parentPort, workerData } = require('node:worker_threads');
const { checkRunDocument } = require(${JSON.stringify(join(__dirname, '..', 'engine', 'index.ts'))});
parentPort.postMessage(checkRunDocument(workerData.doc, workerData.settings));
`;

/** The number of time points of a run document, or 0 when it has none that can be counted. */
export function timePoints(doc: unknown): number {
  const values = (doc as { readings?: { time?: { values?: unknown } } } | null)?.readings?.time?.values;
  return Array.isArray(values) ? values.length : 0;
}

/** The engine's check in a worker thread of its own: the event loop stays free for other requests (health included). */
export function checkOffThread(doc: unknown, settings: BalanceSettings): Promise<CheckResult> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(WORKER_SOURCE, { eval: true, workerData: { doc, settings } });
    worker.once('message', (result: CheckResult) => {
      resolve(result);
      void worker.terminate();
    });
    worker.once('error', reject);
    worker.once('exit', (code) => {
      if (code !== 0) reject(new Error(`the balance check's worker thread stopped with code ${code}`));
    });
  });
}

/** A check inline for a small document (a worker costs more than it saves), in a worker for a large one. */
export async function checkDocument(doc: unknown, settings: BalanceSettings): Promise<CheckResult> {
  return timePoints(doc) >= OFF_THREAD_FROM_READINGS ? checkOffThread(doc, settings) : checkRunDocument(doc, settings);
}
