import { checkRunDocument, type BalanceSettings } from '../engine';
import { runOffThread } from '../core/off-thread';
import { parseDocumentBytes } from './balance-body';
import { HttpProblem } from '../core/problem';
import { checkDocument } from './check-off-thread';
import { documentRangeProblems } from './document-ranges';

/** Bodies from this size on are parsed and checked in a worker thread. */
export const OFF_THREAD_FROM_BYTES = 512 * 1024;

/**
 * POST /api/balance: a stateless check of a run document; stores nothing. The body is a run document,
 * checked by the engine's own validator (validateRunDocument) rather than a class-validator DTO, so
 * that the command line, the stored runs and this endpoint share one definition of a valid document.
 */
export class BalanceService {
  constructor(private readonly settings: BalanceSettings) {}

  async check(body: unknown) {
    this.assertInRange(body);
    return this.resultOf(await checkDocument(body, this.settings));
  }

  /**
   * The check of a body's bytes: a large one (from 512 kB) parsed and checked in a worker thread
   * (balance-body.ts), so that the event loop stays free for other requests; a small one here.
   */
  async checkBytes(bytes: Buffer) {
    if (bytes.length < OFF_THREAD_FROM_BYTES) return this.check(parseDocumentBytes(bytes));
    return runOffThread<ReturnType<BalanceService['checkHere']>>(__filename, 'checkDocumentBytes', [bytes, this.settings]);
  }

  /** The check on this thread (the worker's own). */
  checkHere(body: unknown) {
    this.assertInRange(body);
    return this.resultOf(checkRunDocument(body, this.settings));
  }

  private assertInRange(body: unknown): void {
    const outOfRange = documentRangeProblems(body);
    if (outOfRange.length > 0) {
      throw new HttpProblem(400, 'Invalid run document', `${outOfRange.length} reading(s) are out of range: ${outOfRange.slice(0, 3).map((e) => e.message).join('; ')}`, outOfRange);
    }
  }

  private resultOf(checked: ReturnType<typeof checkRunDocument>) {
    if (!checked.ok) {
      throw new HttpProblem(400, 'Invalid run document',
        `The run document has ${checked.errors.length} problem(s): ${checked.errors.slice(0, 5).map((e) => `${e.path || '(document)'}: ${e.message}`).join('; ')}`,
        checked.errors.map((e) => ({ field: e.path, message: e.message })));
    }
    return checked.result;
  }
}

/**
 * In a worker thread (BalanceService.checkBytes): the whole stateless check of a large document, from
 * its bytes — the JSON parse, the input hygiene, the range checks and the engine — so that none of
 * it holds the event loop.
 */
export function checkDocumentBytes(bytes: Uint8Array, settings: BalanceSettings) {
  return new BalanceService(settings).checkHere(parseDocumentBytes(bytes));
}
