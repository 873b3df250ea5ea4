import { execFileSync } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import bcrypt from 'bcryptjs';
import postgres from 'postgres';
import { ApiClient } from '../../testing/api-harness';
import { freePort, startQwellProcess, type QwellProcess } from '../../testing/qwell-process';

// The database outage drill on a cluster of its own (another folder, and a port free when the spec
// starts), so that stopping PostgreSQL here never disturbs the shared test cluster or another test run. `npm run outage-check` runs the same
// drill against the shared cluster, for more rounds.
const root = join(__dirname, '..', '..');
const base = mkdtempSync(join(tmpdir(), 'qwell-outage-'));
const pgEnv: NodeJS.ProcessEnv = { ...process.env, QWELL_PG_DIR: join(base, 'pg'), QWELL_PG_FAST: '1', QWELL_DB_NAME: 'qwell_outage' };
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
const EMAIL = 'outage.technician@fuzz.test';
const PASSWORD = 'outage drill password';

beforeAll(async () => {
  chmodSync(base, 0o755); // the cluster's unprivileged owner must reach its folder
  pgEnv['QWELL_PG_PORT'] = String(await freePort());
  pg('up');
  const url = pg('url');
  execFileSync(join(root, 'node_modules/.bin/tsx'), ['--tsconfig', 'tsconfig.server.json', 'db/migrate.ts'], {
    cwd: root, env: { ...process.env, DATABASE_URL: url, DATABASE_OWNER_URL: pg('owner-url') }, stdio: 'ignore',
  });
  // One person to sign in with, so that calls past the session reader reach the database.
  const sql = postgres(url, { max: 1, onnotice: () => undefined });
  await sql`INSERT INTO people (email, name, role, password_hash) VALUES (${EMAIL}, 'Outage drill', 'technician', ${bcrypt.hashSync(PASSWORD, 4)})`;
  await sql.end();
  api = await startQwellProcess({ DATABASE_URL: url, QWELL_WORKER: '0' });
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

  it('while it is down, every API call that needs it answers 503 problem+json saying so, sign-in included; afterwards they work again', async () => {
    const url = api!.url;
    const signedIn = new ApiClient(url);
    expect((await signedIn.signIn(EMAIL, PASSWORD)).status).toBe(200);
    expect((await signedIn.get('/api/runs')).status).toBe(200);
    pg('down');
    try {
      for (const res of [
        await signedIn.get('/api/runs'),
        await signedIn.get('/api/instruments'),
        await signedIn.post('/api/runs', { projectId: 1, title: 'During the outage', process: 'isothermal', runDate: '2026-03-14' }),
        await new ApiClient(url).signIn(EMAIL, PASSWORD),
      ]) {
        expect({ status: res.status, type: res.headers['content-type'] }).toEqual({ status: 503, type: expect.stringContaining('application/problem+json') });
        expect(res.body.detail).toMatch(/database cannot be reached/);
        expect(res.headers['retry-after']).toBe('30');
      }
    } finally {
      pg('up');
    }
    expect(await healthBecomes(url, 200)).toBe(200);
    expect((await signedIn.get('/api/runs')).status).toBe(200);
  }, 90_000);
});
