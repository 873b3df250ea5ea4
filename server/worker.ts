import type { Database } from '../db/client';
import { takeCheckpoint } from './audit/audit-checkpoint';
import { runBalanceCheck, submittedWithoutResult } from './balance/balance-check';
import type { Config } from './config';
import { sendCalibrationReminder } from './instruments/calibration-reminder';
import type { JobQueue } from './jobs/job-queue';
import type { MailDispatcher } from './mail/mail-dispatcher';
import { purgeStaleUploads } from './imports/upload-retention';

/** Re-queues every submitted run that has no result for its version (after a crash, say). */
export async function sweepUncheckedRuns(db: Database, queue: JobQueue): Promise<number> {
  const pending = await submittedWithoutResult(db);
  for (const job of pending) await queue.enqueueBalanceCheck(job);
  return pending.length;
}

/** The background side of a Qwell process: balance checks, the daily calibration mail, the sweep. */
export async function startWorker(db: Database, config: Config, queue: JobQueue, mail: MailDispatcher | null): Promise<void> {
  await queue.workBalanceChecks(async ({ runId, version }) => {
    await runBalanceCheck(db, config, runId, version);
    void mail?.flush();
  });
  await queue.scheduleMaintenance(
    async () => {
      await sendCalibrationReminder(db);
      void mail?.flush();
    },
    async () => void (await sweepUncheckedRuns(db, queue)),
  );
  await queue.scheduleUploadCleanup(async () => void (await purgeStaleUploads(db, config.uploadRetentionDays)));
  await queue.scheduleCheckpoints(config.checkpointMinutes, async () => void (await takeCheckpoint(db, config, 'schedule')));
  await sweepUncheckedRuns(db, queue);
}
