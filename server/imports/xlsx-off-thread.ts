import { runOffThread } from '../core/off-thread';
import type { ImportLimits } from './import-limits';
import { unreadableFile } from './import-problems';
import type { RawTable } from './raw-table';
import { readXlsx } from './xlsx-reader';
import { declaredExpandedBytes, tookTooLong } from './zip-inspection';

/**
 * From this many declared bytes inside the archive on, a workbook is read in a worker thread: below it,
 * the read takes milliseconds and a worker (about half a second to start) would cost more than it saves.
 */
export const OFF_THREAD_FROM_EXPANDED_BYTES = 1024 * 1024;
/** Heap a workbook's worker may use; the parts it reads are buffers outside it, bounded by the byte budget. */
const WORKER_HEAP_MB = 512;

/** readXlsx in the worker: the bytes arrive as a plain Uint8Array and are read as a Buffer again. */
export function readXlsxBytes(bytes: Uint8Array, filename: string, limits: ImportLimits, sheet?: string): Promise<RawTable> {
  return readXlsx(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength), filename, limits, sheet);
}

/**
 * Reads a workbook's sheet with the inspection's byte and time budgets, off the request thread when it
 * is large, so that one big upload cannot hold up everyone else's requests. The worker is stopped when
 * the time budget is spent even if exceljs never returns to check it.
 */
export async function readWorkbook(buf: Buffer, filename: string, limits: ImportLimits, sheet?: string): Promise<RawTable> {
  if (declaredExpandedBytes(buf) < OFF_THREAD_FROM_EXPANDED_BYTES) return readXlsx(buf, filename, limits, sheet);
  return runOffThread<RawTable>(__filename, 'readXlsxBytes', [buf, filename, limits, sheet], {
    // The worker's own deadline answers first with the budget's message; this stops a worker that cannot.
    timeoutMs: limits.maxSeconds * 1000 + 2000,
    timedOut: () => tookTooLong(limits),
    maxHeapMb: WORKER_HEAP_MB,
    outOfMemory: () => unreadableFile(`"${filename}" needs more memory to read than Qwell spends on one file. Split the data into smaller files, or export it as CSV.`),
  });
}
