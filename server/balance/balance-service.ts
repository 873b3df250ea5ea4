import type { BalanceSettings } from '../engine';
import { HttpProblem } from '../core/problem';
import { checkDocument } from './check-off-thread';
import { documentRangeProblems } from './document-ranges';

/**
 * POST /api/balance: a stateless check of a run document; stores nothing. The body is a run document,
 * checked by the engine's own validator (validateRunDocument) rather than a class-validator DTO, so
 * that the command line, the stored runs and this endpoint share one definition of a valid document.
 */
export class BalanceService {
  constructor(private readonly settings: BalanceSettings) {}

  async check(body: unknown) {
    const outOfRange = documentRangeProblems(body);
    if (outOfRange.length > 0) {
      throw new HttpProblem(400, 'Invalid run document', `${outOfRange.length} reading(s) are out of range: ${outOfRange.slice(0, 3).map((e) => e.message).join('; ')}`, outOfRange);
    }
    const checked = await checkDocument(body, this.settings);
    if (!checked.ok) {
      throw new HttpProblem(400, 'Invalid run document',
        `The run document has ${checked.errors.length} problem(s): ${checked.errors.slice(0, 5).map((e) => `${e.path || '(document)'}: ${e.message}`).join('; ')}`,
        checked.errors.map((e) => ({ field: e.path, message: e.message })));
    }
    return checked.result;
  }
}
