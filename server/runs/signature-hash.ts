import type { balanceResults } from '../../db/schema';
import { sha256Canonical } from '../engine';
import type { RunRow } from './run-access';
import type { ReadingRow } from './run-document-mapper';

/** SHA-256 of what a signer saw: the run as stored, its readings and the balance result it was judged on. */
export function signedHash(run: RunRow, rows: readonly ReadingRow[], result: typeof balanceResults.$inferSelect | undefined): string {
  return sha256Canonical({
    run: { id: run.id, code: run.code, revision: run.revision, version: run.version, title: run.title, process: run.process, runDate: run.runDate, setup: run.setup },
    readings: sha256Canonical(rows),
    result: result ? { id: result.id, inputHash: result.inputHash, engineVersion: result.engineVersion, verdict: result.verdict, en: result.en } : null,
  });
}
