import PgBoss from 'pg-boss';

export const BALANCE_QUEUE = 'balance-check';
export const CALIBRATION_DUE_QUEUE = 'calibration-due';
export const SWEEP_QUEUE = 'balance-sweep';
export const UPLOAD_CLEANUP_QUEUE = 'upload-cleanup';
export const CHECKPOINT_QUEUE = 'audit-checkpoint';

export interface BalanceJob {
  runId: number;
  version: number;
}

/**
 * The PostgreSQL-backed job queue (pg-boss): heavy engine work leaves the request, survives a crash
 * of the process that queued it, and any worker process on the same database can take it.
 */
export class JobQueue {
  private readonly boss: PgBoss;

  private readonly expireSeconds: number;

  constructor(databaseUrl: string, private readonly onError: (error: Error) => void = () => undefined) {
    // A check whose worker died (kill -9, power cut) is retried once it expires; maintenance notices it.
    this.expireSeconds = Number(process.env['QWELL_JOB_EXPIRE_SECONDS'] ?? 120);
    const maintenanceIntervalSeconds = Number(process.env['QWELL_QUEUE_MAINTENANCE_SECONDS'] ?? 30);
    this.boss = new PgBoss({ connectionString: databaseUrl, schema: 'pgboss', max: 4, supervise: true, schedule: true, maintenanceIntervalSeconds });
    this.boss.on('error', (error) => this.onError(error));
  }

  async start(): Promise<void> {
    await this.boss.start();
    const balance = { name: BALANCE_QUEUE, policy: 'standard' as const, retryLimit: 3, retryDelay: 1, expireInSeconds: this.expireSeconds };
    await this.boss.createQueue(BALANCE_QUEUE, balance);
    // createQueue keeps an existing queue's options; the lease of this process's settings applies from now on.
    await this.boss.updateQueue(BALANCE_QUEUE, balance);
    await this.boss.createQueue(CALIBRATION_DUE_QUEUE, { name: CALIBRATION_DUE_QUEUE, policy: 'standard', retryLimit: 2 });
    await this.boss.createQueue(SWEEP_QUEUE, { name: SWEEP_QUEUE, policy: 'standard' });
    await this.boss.createQueue(UPLOAD_CLEANUP_QUEUE, { name: UPLOAD_CLEANUP_QUEUE, policy: 'standard' });
    await this.boss.createQueue(CHECKPOINT_QUEUE, { name: CHECKPOINT_QUEUE, policy: 'standard' });
  }

  /** One job per run version: queuing the same check twice is a no-op. */
  async enqueueBalanceCheck(job: BalanceJob): Promise<void> {
    await this.boss.send(BALANCE_QUEUE, job, { singletonKey: `${job.runId}:${job.version}` });
  }

  async workBalanceChecks(handler: (job: BalanceJob) => Promise<void>): Promise<void> {
    await this.boss.work<BalanceJob>(BALANCE_QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => handler(job.data));
  }

  /** Daily mail about calibrations coming due, and a sweep that re-queues checks a crash may have lost. */
  async scheduleMaintenance(calibrationDue: () => Promise<void>, sweep: () => Promise<void>): Promise<void> {
    await this.boss.schedule(CALIBRATION_DUE_QUEUE, '0 6 * * *', {}, { tz: 'UTC' });
    await this.boss.schedule(SWEEP_QUEUE, '*/5 * * * *', {}, { tz: 'UTC' });
    await this.boss.work(CALIBRATION_DUE_QUEUE, async () => calibrationDue());
    await this.boss.work(SWEEP_QUEUE, async () => sweep());
  }

  /** Daily at 03:00 UTC: uploads past their retention period are deleted. */
  async scheduleUploadCleanup(cleanup: () => Promise<void>): Promise<void> {
    await this.boss.schedule(UPLOAD_CLEANUP_QUEUE, '0 3 * * *', {}, { tz: 'UTC' });
    await this.boss.work(UPLOAD_CLEANUP_QUEUE, async () => cleanup());
  }

  /** A signed checkpoint of the audit trail's head every `minutes` minutes (audit-checkpoint.ts). */
  async scheduleCheckpoints(minutes: number, take: () => Promise<void>): Promise<void> {
    const every = Math.min(59, Math.max(1, minutes));
    await this.boss.schedule(CHECKPOINT_QUEUE, `*/${every} * * * *`, {}, { tz: 'UTC' });
    await this.boss.work(CHECKPOINT_QUEUE, async () => take());
  }

  async stop(): Promise<void> {
    await this.boss.stop({ graceful: true, timeout: 5000, wait: true });
  }
}
