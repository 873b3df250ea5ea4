import { asc, eq, isNull, lt, sql, and } from 'drizzle-orm';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Database } from '../../db/client';
import { mailOutbox } from '../../db/schema';
import type { Config } from '../config';

const MAX_ATTEMPTS = 8;
const BATCH = 20;

/**
 * Sends what is waiting in the outbox. Rows are claimed with SKIP LOCKED, so several API processes can
 * run a dispatcher each without sending a message twice.
 */
export class MailDispatcher {
  private readonly transport: Transporter;
  private timer?: NodeJS.Timeout;
  private running: Promise<number> | null = null;

  constructor(
    private readonly db: Database,
    private readonly config: Config,
    private readonly onError: (error: unknown) => void = () => undefined,
  ) {
    this.transport = nodemailer.createTransport({
      host: config.mail.host,
      port: config.mail.port,
      secure: false,
      ignoreTLS: config.mail.host === '127.0.0.1',
      connectionTimeout: 5000,
    });
  }

  start(intervalMs = 2000): void {
    this.timer = setInterval(() => void this.flush(), intervalMs);
    this.timer.unref();
  }

  stop(): void {
    if (this.timer) clearInterval(this.timer);
    this.transport.close();
  }

  /**
   * Sends one batch; returns how many went out. Concurrent calls share one pass. Never rejects: with
   * the database away the mail simply waits in the outbox for the next pass.
   */
  flush(): Promise<number> {
    this.running ??= this.sendAll()
      .catch((error: unknown) => {
        this.onError(error);
        return 0;
      })
      .finally(() => (this.running = null));
    return this.running;
  }

  /** Batches until the outbox is empty (or 50 batches, so one pass never runs unbounded). */
  private async sendAll(): Promise<number> {
    let total = 0;
    for (let pass = 0; pass < 50; pass++) {
      const { claimed, sent } = await this.sendBatch();
      total += sent;
      if (claimed < BATCH) break;
    }
    return total;
  }

  private async sendBatch(): Promise<{ claimed: number; sent: number }> {
    let sent = 0;
    let claimed = 0;
    await this.db.transaction(async (tx) => {
      const batch = await tx
        .select()
        .from(mailOutbox)
        .where(and(isNull(mailOutbox.sentAt), lt(mailOutbox.attempts, MAX_ATTEMPTS)))
        .orderBy(asc(mailOutbox.id))
        .limit(BATCH)
        .for('update', { skipLocked: true });
      claimed = batch.length;
      for (const mail of batch) {
        try {
          await this.transport.sendMail({ from: this.config.mail.from, to: mail.recipient, subject: mail.subject, text: mail.body });
          await tx.update(mailOutbox).set({ sentAt: sql`now()`, attempts: mail.attempts + 1, lastError: null }).where(eq(mailOutbox.id, mail.id));
          sent += 1;
        } catch (error) {
          const message = error instanceof Error ? error.message : String(error);
          await tx.update(mailOutbox).set({ attempts: mail.attempts + 1, lastError: message.slice(0, 500) }).where(eq(mailOutbox.id, mail.id));
        }
      }
    });
    return { claimed, sent };
  }
}
