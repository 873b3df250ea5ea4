import { spawn, type ChildProcess, type StdioOptions } from 'node:child_process';
import { join } from 'node:path';

const root = join(__dirname, '..');

/**
 * Starts server/main.ts in a Node process of its own, with tsx loaded inside it. The `tsx` command
 * would run the server in a second process below itself, and a signal to that wrapper (SIGKILL
 * above all) would leave the server running and holding its port.
 */
export function spawnServer(env: NodeJS.ProcessEnv, stdio: StdioOptions): ChildProcess {
  return spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    cwd: root,
    env: { ...env, TSX_TSCONFIG_PATH: 'tsconfig.server.json' },
    stdio,
  });
}
