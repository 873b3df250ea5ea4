import type { ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import { spawnServer } from '../../testing/spawn-server';

export const E2E_PORT = Number(process.env['QWELL_E2E_PORT'] ?? 3100);
export const BASE_URL = `http://127.0.0.1:${E2E_PORT}`;
export const root = join(__dirname, '..', '..');

/** Starts the real server (tsx) on the e2e port and waits until /api/health answers. */
export async function startServer(env: Record<string, string>): Promise<ChildProcess> {
  const child = spawnServer({ ...process.env, PORT: String(E2E_PORT), LOG_LEVEL: 'warn', ...env }, ['ignore', 'inherit', 'inherit']);
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the server exited with code ${child.exitCode}`);
    try {
      const res = await fetch(`${BASE_URL}/api/health`);
      if (res.ok) return child;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  child.kill('SIGKILL');
  throw new Error(`the server did not answer on ${BASE_URL} within 60 s`);
}
