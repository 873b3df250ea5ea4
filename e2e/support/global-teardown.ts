import { existsSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { root } from './server-process';

export default async function globalTeardown(): Promise<void> {
  const file = join(root, '.data', 'e2e-server.pid');
  if (!existsSync(file)) return;
  const pid = Number(readFileSync(file, 'utf8'));
  rmSync(file);
  try {
    process.kill(pid, 'SIGTERM');
  } catch {
    // already gone
  }
}
