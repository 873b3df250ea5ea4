import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { HttpProblem } from './problem';

/** How a task in a worker thread is run and bounded. */
export interface OffThreadOptions {
  /** Stops the worker after this many ms and rejects with timedOut(). */
  timeoutMs?: number;
  timedOut?: () => Error;
  /** Heap of the worker in MB: past it the worker is stopped and the call rejects with outOfMemory(). */
  maxHeapMb?: number;
  outOfMemory?: () => Error;
  /** Chunks fed to the task as an async iterable (its next-to-last argument), e.g. a request body as it arrives. */
  input?: AsyncIterable<Uint8Array>;
  /**
   * Values the task hands out before it ends, through `await emit(value)` (its last argument), in
   * order. The task waits while `emitWindow` (default 2) values are not yet acknowledged by ack(),
   * so that a slow consumer does not pile them up in memory.
   */
  onEmit?: (value: unknown, ack: () => void) => void;
  emitWindow?: number;
  /** Stops the worker; the call then rejects with the signal's reason. */
  signal?: AbortSignal;
}

// The worker loads the task's TypeScript through tsx's require hook, as the server itself runs. A task
// may throw an HttpProblem: it crosses the thread as its fields and is thrown again here, so the
// answer is the 4xx the task meant. With `input`, chunks arrive as messages and end with null; the
// task's emit(value) posts { emitted: value } before its answer, and waits while `window` of them
// are not acknowledged ({ ack: 1 } messages).
const WORKER_SOURCE = `
require('tsx/cjs');
const { parentPort, workerData } = require('node:worker_threads');
const { HttpProblem } = require(${JSON.stringify(join(__dirname, 'problem.ts'))});
const task = require(workerData.module)[workerData.fn];
let input;
let unacked = 0;
let acked = null;
const emit = async (emitted) => {
  parentPort.postMessage({ emitted });
  unacked += 1;
  while (unacked >= workerData.window) await new Promise((resolve) => { acked = resolve; });
};
const queue = [];
let wake = null;
parentPort.on('message', (chunk) => {
  if (chunk !== null && !(chunk instanceof Uint8Array)) {
    unacked -= 1;
    if (acked) { acked(); acked = null; }
    return;
  }
  queue.push(chunk);
  if (wake) { wake(); wake = null; }
});
if (workerData.streamed) {
  input = (async function* () {
    for (;;) {
      if (queue.length === 0) await new Promise((resolve) => { wake = resolve; });
      const chunk = queue.shift();
      if (chunk === null) return;
      yield chunk;
    }
  })();
}
Promise.resolve()
  .then(() => task(...workerData.args, ...(workerData.streamed ? [input] : []), emit))
  .then((result) => parentPort.postMessage({ result }), (err) => parentPort.postMessage({
    problem: err instanceof HttpProblem ? { status: err.status, title: err.title, detail: err.detail, errors: err.errors, extra: err.extra } : undefined,
    message: String((err && err.stack) || err),
  }));
`;

interface Answer<T> {
  emitted?: unknown;
  result?: T;
  problem?: { status: number; title: string; detail: string; errors?: HttpProblem['errors']; extra?: Record<string, unknown> };
  message?: string;
}

/**
 * Runs `fn(...args)` of a TypeScript module in a worker thread of its own, so that the event loop stays
 * free for other requests while it works; the worker is stopped when it answers, fails, runs out of
 * time or of memory. Arguments and the result are copied between threads (structured clone).
 */
export function runOffThread<T>(modulePath: string, fn: string, args: unknown[], options: OffThreadOptions = {}): Promise<T> {
  const worker = new Worker(WORKER_SOURCE, {
    eval: true,
    workerData: { module: modulePath, fn, args, streamed: options.input !== undefined, window: options.emitWindow ?? 2 },
    ...(options.maxHeapMb ? { resourceLimits: { maxOldGenerationSizeMb: options.maxHeapMb } } : {}),
  });
  let settled = false;
  return new Promise<T>((resolve, reject) => {
    const finish = (error: Error | null, result?: T) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      void worker.terminate();
      if (error) reject(error);
      else resolve(result as T);
    };
    const timer = options.timeoutMs !== undefined
      ? setTimeout(() => finish(options.timedOut?.() ?? new Error(`${fn} did not finish in ${options.timeoutMs} ms`)), options.timeoutMs)
      : undefined;
    worker.on('message', (answer: Answer<T>) => {
      if ('emitted' in answer) {
        if (!settled) options.onEmit?.(answer.emitted, () => settled || worker.postMessage({ ack: 1 }));
      } else if (answer.problem) {
        const p = answer.problem;
        finish(new HttpProblem(p.status, p.title, p.detail, p.errors, p.extra ?? {}));
      } else if (answer.message !== undefined) {
        finish(new Error(`${fn} failed in its worker thread: ${answer.message}`));
      } else {
        finish(null, answer.result);
      }
    });
    worker.once('error', (err: Error & { code?: string }) => {
      finish(err.code === 'ERR_WORKER_OUT_OF_MEMORY' && options.outOfMemory ? options.outOfMemory() : err);
    });
    worker.once('exit', (code) => finish(new Error(`${fn}'s worker thread stopped with code ${code}`)));
    options.signal?.addEventListener('abort', () => finish(options.signal!.reason instanceof Error ? options.signal!.reason : new Error(`${fn} was stopped`)), { once: true });
    if (options.input) void feed(worker, options.input, () => settled, (err) => finish(err));
  });
}

/** Posts the input's chunks to the worker as they come, then null; a failing input fails the call. */
async function feed(worker: Worker, input: AsyncIterable<Uint8Array>, done: () => boolean, fail: (err: Error) => void): Promise<void> {
  try {
    for await (const chunk of input) {
      if (done()) return;
      // A copy of the chunk's own bytes (a Buffer may view a larger shared pool), handed over without a second copy.
      const own = new Uint8Array(chunk);
      worker.postMessage(own, [own.buffer]);
    }
    worker.postMessage(null);
  } catch (err) {
    fail(err instanceof Error ? err : new Error(String(err)));
  }
}
