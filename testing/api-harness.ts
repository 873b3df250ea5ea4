import type { Express } from 'express';
import { mkdtempSync, rmSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { SMTPServer } from 'smtp-server';
import request from 'supertest';
import { createDb, type DbHandle } from '../db/client';
import { DEFAULT_DEMO_PASSWORD, demoEmail } from '../db/seed/demo-lab';
import { seedDemoLab } from '../db/seed/seed';
import type { Role } from '../db/schema';
import { createApp } from '../server/app';
import { loadConfig, type Config } from '../server/config';
import { XSRF_COOKIE } from '../server/core/csrf';
import { JobQueue } from '../server/jobs/job-queue';
import { startMailCatcher } from '../server/mail/mail-catcher';
import { MailDispatcher } from '../server/mail/mail-dispatcher';
import { startWorker } from '../server/worker';

export const DEMO_PASSWORD = DEFAULT_DEMO_PASSWORD;

export interface ApiHarness {
  app: Express;
  handle: DbHandle;
  config: Config;
  queue: JobQueue | null;
  mail: MailDispatcher | null;
  /** Where the loopback SMTP catcher keeps the messages it receives. */
  mailDir: string;
  close(): Promise<void>;
}

export interface HarnessOptions {
  /** Start the job queue, the balance worker, a mail catcher and the mail dispatcher. */
  worker?: boolean;
}

/** The real app on the migrated test database (npm test creates it fresh), with the demo lab loaded. */
export async function startHarness(overrides: Partial<Config> = {}, options: HarnessOptions = {}): Promise<ApiHarness> {
  if (!process.env['DATABASE_URL']?.includes('qwell_test')) {
    throw new Error('API tests need the fresh test database: run them through "npm test".');
  }
  const mailDir = mkdtempSync(join(tmpdir(), 'qwell-mail-'));
  let catcher: SMTPServer | null = null;
  let mailPort = 0;
  if (options.worker) {
    catcher = await startMailCatcher(mailDir, 0);
    mailPort = (catcher.server.address() as AddressInfo).port;
  }
  const base = loadConfig();
  const config = loadConfig({
    logLevel: 'silent',
    signInRateLimit: 10_000,
    // A few thousand draws keep API tests quick; the engine's own tests check the Monte Carlo method.
    balance: { ...base.balance, draws: 2000 },
    mail: { ...base.mail, port: mailPort },
    ...overrides,
  });
  const handle = createDb(config.databaseUrl, 6);
  await seedDemoLab(handle.db, DEMO_PASSWORD);
  let queue: JobQueue | null = null;
  let mail: MailDispatcher | null = null;
  if (options.worker) {
    queue = new JobQueue(config.databaseUrl);
    await queue.start();
    mail = new MailDispatcher(handle.db, config);
    await startWorker(handle.db, config, queue, mail);
  }
  return {
    app: createApp(config, handle, queue),
    handle,
    config,
    queue,
    mail,
    mailDir,
    close: async () => {
      mail?.stop();
      await queue?.stop();
      await new Promise<void>((resolve) => (catcher ? catcher.close(() => resolve()) : resolve()));
      await handle.close();
      rmSync(mailDir, { recursive: true, force: true });
    },
  };
}

/** Polls until the check returns a value other than undefined, or fails after the timeout. */
export async function eventually<T>(check: () => Promise<T | undefined>, timeoutMs = 20_000, what = 'condition'): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await check();
    if (value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** A browser-like client: keeps cookies and echoes the CSRF cookie in its header. */
export class ApiClient {
  readonly agent: ReturnType<typeof request.agent>;
  private xsrf = '';

  /** An in-process app, or the base URL of a running Qwell process. */
  constructor(app: Express | string) {
    this.agent = request.agent(app);
  }

  get xsrfToken(): string {
    return this.xsrf;
  }

  async primeCsrf(): Promise<void> {
    const res = await this.agent.get('/api/auth/me');
    const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
    const found = cookies.find((c) => c.startsWith(`${XSRF_COOKIE}=`));
    if (found) this.xsrf = decodeURIComponent(found.split(';')[0].slice(XSRF_COOKIE.length + 1));
  }

  get(path: string) {
    return this.agent.get(path);
  }

  post(path: string, body?: object) {
    return this.agent.post(path).set('X-XSRF-TOKEN', this.xsrf).send(body);
  }

  put(path: string, body?: object) {
    return this.agent.put(path).set('X-XSRF-TOKEN', this.xsrf).send(body);
  }

  patch(path: string, body?: object) {
    return this.agent.patch(path).set('X-XSRF-TOKEN', this.xsrf).send(body);
  }

  delete(path: string) {
    return this.agent.delete(path).set('X-XSRF-TOKEN', this.xsrf);
  }

  async signIn(email: string, password = DEMO_PASSWORD) {
    if (!this.xsrf) await this.primeCsrf();
    return this.post('/api/auth/sign-in', { email, password });
  }
}

/** A client already signed in as the demo person of a role. */
export async function clientAs(app: Express, role: Role | null): Promise<ApiClient> {
  const client = new ApiClient(app);
  await client.primeCsrf();
  if (role) {
    const res = await client.signIn(demoEmail(role));
    if (res.status !== 200) throw new Error(`demo sign-in as ${role} failed: ${res.status} ${JSON.stringify(res.body)}`);
  }
  return client;
}
