import type { ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { spawnServer } from './spawn-server';

export interface QwellProcess {
  child: ChildProcess;
  url: string;
  output: string[];
  stop(signal?: NodeJS.Signals): Promise<void>;
}

/** A loopback port nobody listens on now, so two test runs on one machine never ask for the same one. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as { port: number };
      probe.close(() => resolve(port));
    });
  });
}

/**
 * Starts `server/main.ts` as its own OS process and waits until it says it is ready. A process that
 * serves the API listens on `port`, or on a free port when none is given; a worker-only one listens nowhere.
 */
export async function startQwellProcess(env: Record<string, string>, port?: number): Promise<QwellProcess> {
  if (port === undefined && env['QWELL_API'] !== '0') port = await freePort();
  const child = spawnServer(
    { ...process.env, LOG_LEVEL: 'warn', QWELL_MAIL_CATCHER: '0', SMTP_PORT: '1', ...(port ? { PORT: String(port) } : {}), ...env },
    ['ignore', 'pipe', 'pipe'],
  );
  const output: string[] = [];
  const ready = new Promise<void>((resolve, reject) => {
    const onData = (chunk: Buffer) => {
      const text = chunk.toString();
      output.push(text);
      if (/\[qwell\] (serving|worker only)/.test(text)) resolve();
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', (c: Buffer) => output.push(c.toString()));
    child.once('exit', (code) => reject(new Error(`qwell process exited with ${code}: ${output.join('')}`)));
  });
  const timeout = new Promise<never>((_, reject) => setTimeout(() => reject(new Error(`qwell process not ready in 60 s: ${output.join('')}`)), 60_000).unref());
  await Promise.race([ready, timeout]);
  return {
    child,
    url: `http://127.0.0.1:${port ?? 0}`,
    output,
    stop: (signal: NodeJS.Signals = 'SIGTERM') =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null || child.signalCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill(signal);
      }),
  };
}
