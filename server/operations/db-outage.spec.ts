import { execFileSync } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startQwellProcess, type QwellProcess } from '../testing/qwell-process';

// The database outage drill on a cluster of its own (another folder and port), so that stopping
// PostgreSQL here never disturbs the shared test cluster. `npm run outage-check` runs the same
// drill against the shared cluster, for more rounds.
const root = join(__dirname, '..', '..');
const base = mkdtempSync(join(tmpdir(), 'qwell-outage-'));
const pgEnv = { ...process.env, QWELL_PG_DIR: join(base, 'pg'), QWELL_PG_PORT: '54339', QWELL_PG_FAST: '1', QWELL_DB_NAME: 'qwell_outage' };
const pg = (...args: string[]) => execFileSync('bash', [join(root, 'tools', 'pg'), ...args], { env: pgEnv, encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] }).trim();

async function health(url: string): Promise<number | string> {
  try {
    return (await fetch(`${url}/api/health`)).status;
  } catch (error) {
    return `no answer (${String((error as Error).cause ?? error)})`;
  }
}

async function healthBecomes(url: string, status: number, timeoutMs = 30_000): Promise<number | string> {
  const until = Date.now() + timeoutMs;
  let last = await health(url);
  while (last !== status && Date.now() < until) {
    await new Promise((r) => setTimeout(r, 250));
    last = await health(url);
  }
  return last;
}

let api: QwellProcess | undefined;

beforeAll(async () => {
  chmodSync(base, 0o755); // the cluster's unprivileged owner must reach its folder
  pg('up');
  const url = pg('url');
  execFileSync(join(root, 'node_modules/.bin/tsx'), ['--tsconfig', 'tsconfig.server.json', 'db/migrate.ts'], {
    cwd: root, env: { ...process.env, DATABASE_URL: url }, stdio: 'ignore',
  });
  api = await startQwellProcess({ DATABASE_URL: url, QWELL_WORKER: '0' }, 3395);
}, 120_000);

afterAll(async () => {
  await api?.stop('SIGKILL');
  try {
    pg('down');
  } finally {
    rmSync(base, { recursive: true, force: true });
  }
}, 60_000);

describe('PostgreSQL stopped and started while the app runs', () => {
  it.each([1, 2])('round %i: /api/health reports the outage, and the app reconnects without a restart', async () => {
    const url = api!.url;
    expect(await health(url)).toBe(200);
    pg('down');
    try {
      // The process keeps answering: 503 with the database unreachable, not a crash or a hang.
      expect(await health(url)).toBe(503);
      const body = await (await fetch(`${url}/api/health`)).json();
      expect(body).toEqual({ status: 'degraded', db: 'unreachable' });
    } finally {
      pg('up');
    }
    expect(await healthBecomes(url, 200)).toBe(200);
    expect(api!.child.exitCode).toBeNull();
  }, 90_000);
});
