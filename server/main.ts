import { createDb } from '../db/client';
import { createApp } from './app';
import { loadConfig } from './config';
import { JobQueue } from './jobs/job-queue';
import { startMailCatcher } from './mail/mail-catcher';
import { MailDispatcher } from './mail/mail-dispatcher';
import { startWorker } from './worker';

async function main(): Promise<void> {
  const config = loadConfig();
  const handle = createDb(config.databaseUrl);
  if (config.mailCatcher) {
    await startMailCatcher(config.mailDir, config.mail.port, config.mail.host).then(
      () => console.log(`[qwell] catching mail on ${config.mail.host}:${config.mail.port} into ${config.mailDir}`),
      (error: NodeJS.ErrnoException) => console.log(`[qwell] mail catcher not started here (${error.code ?? error.message}); another process may run it`),
    );
  }
  const queue = new JobQueue(config.databaseUrl, (error) => console.error('[queue]', error.message));
  await queue.start();
  const mail = new MailDispatcher(handle.db, config, (error) => console.error('[mail]', error instanceof Error ? error.message : error));
  mail.start(config.mail.sendIntervalMs);
  if (config.worker) await startWorker(handle.db, config, queue, mail);

  // QWELL_API=0 makes a worker-only process: it takes queued checks and serves nothing.
  const app = createApp(config, handle, queue);
  const server = process.env['QWELL_API'] === '0'
    ? null
    : app.listen(config.port, config.host, (error?: Error) => {
        // Express 5 calls back on a listen error too (the port taken, say): then there is nothing to serve.
        if (error) {
          console.error(`[qwell] cannot listen on ${config.host}:${config.port}: ${error.message}`);
          process.exit(1);
        }
        console.log(`[qwell] serving http://${config.host}:${config.port}${config.worker ? ' (with balance worker)' : ''}`);
      });
  if (!server) console.log('[qwell] worker only: taking balance checks');

  let closing = false;
  const shutdown = (signal: string) => {
    if (closing) return;
    closing = true;
    console.log(`[qwell] ${signal}: closing`);
    setTimeout(() => process.exit(0), 8000).unref();
    const finish = () => {
      mail.stop();
      void queue.stop().finally(() => void handle.close().then(() => process.exit(0)));
    };
    if (server) server.close(finish);
    else finish();
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
}

// A background task that fails (the database restarting, say) is logged; requests carry on.
process.on('unhandledRejection', (reason) => console.error('[qwell] background task failed:', reason instanceof Error ? reason.message : reason));

main().catch((error: unknown) => {
  console.error('[qwell] could not start:', error instanceof Error ? error.message : error);
  process.exit(1);
});
