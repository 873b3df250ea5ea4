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
  const mail = new MailDispatcher(handle.db, config);
  mail.start(config.mail.sendIntervalMs);
  if (config.worker) await startWorker(handle.db, config, queue, mail);

  const app = createApp(config, handle, queue);
  const server = app.listen(config.port, config.host, () => {
    console.log(`[qwell] serving http://${config.host}:${config.port}${config.worker ? ' (with balance worker)' : ''}`);
  });

  let closing = false;
  const shutdown = (signal: string) => {
    if (closing) return;
    closing = true;
    console.log(`[qwell] ${signal}: closing`);
    setTimeout(() => process.exit(0), 8000).unref();
    server.close(() => {
      mail.stop();
      void queue.stop().finally(() => void handle.close().then(() => process.exit(0)));
    });
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
}

main().catch((error: unknown) => {
  console.error('[qwell] could not start:', error instanceof Error ? error.message : error);
  process.exit(1);
});
