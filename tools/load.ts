// Load test on loopback (issue 7): GET /api/runs (page of 50 with 10⁴ runs stored) and
// GET /api/runs/:id/balance against a bare Express endpoint on the same machine as the reference.
// Bounded: 32 connections for QWELL_LOAD_SECONDS (default 20) per target, loopback only.
import 'reflect-metadata';
import autocannon from 'autocannon';
import { eq, sql } from 'drizzle-orm';
import { spawn } from 'node:child_process';
import { cpus } from 'node:os';
import { join } from 'node:path';
import { createDb } from '../db/client';
import { runs } from '../db/schema';
import { DEFAULT_DEMO_PASSWORD, demoEmail } from '../db/seed/demo-lab';
import { seedDemoLab } from '../db/seed/seed';
import { startQwellProcess } from '../testing/qwell-process';

const API_PORT = 3300;
const BARE_PORT = 3301;
const seconds = Number(process.env['QWELL_LOAD_SECONDS'] ?? 20);
const connections = 32;
const WARM_UP_SECONDS = 3;
// What every browser sends; the bare endpoint gets it too.
const BROWSER_HEADERS = { 'accept-encoding': 'gzip, deflate, br', accept: 'application/json, text/plain, */*' };
const root = join(__dirname, '..');

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

/** Unmeasured requests first, so the figures are of a process whose code the JIT has compiled. */
async function warmUp(url: string, headers: Record<string, string>): Promise<void> {
  await new Promise((resolve, reject) => {
    autocannon({ url, connections, duration: WARM_UP_SECONDS, headers }, (error, res) => (error ? reject(error) : resolve(res)));
  });
}

async function hammer(name: string, url: string, headers: Record<string, string> = {}) {
  await warmUp(url, headers);
  const latencies: number[] = [];
  let non2xx = 0;
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ url, connections, duration: seconds, headers }, (error, res) => (error ? reject(error) : resolve(res)));
    instance.on('response', (_client, status, _bytes, ms) => {
      latencies.push(ms);
      if (status < 200 || status >= 300) non2xx += 1;
    });
  });
  latencies.sort((a, b) => a - b);
  const row = {
    target: name,
    requests: latencies.length,
    'req/s': Math.round(result.requests.average),
    p50: percentile(latencies, 50).toFixed(1),
    p95: percentile(latencies, 95).toFixed(1),
    p99: percentile(latencies, 99).toFixed(1),
    errors: non2xx + result.errors + result.timeouts,
  };
  console.log(JSON.stringify(row));
  return row;
}

async function waitFor(url: string): Promise<void> {
  for (let i = 0; i < 240; i++) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} did not answer`);
}

async function main(): Promise<void> {
  const url = process.env['DATABASE_URL']!;
  const handle = createDb(url, 2);
  await seedDemoLab(handle.db, DEFAULT_DEMO_PASSWORD);
  const [{ n }] = await handle.db.select({ n: sql<number>`count(*)::int` }).from(runs);
  if (n < 10_000) {
    // Copies of a demo run's row (no readings needed for the list) up to 10⁴ runs.
    await handle.db.execute(sql`
      INSERT INTO runs (code, project_id, author_id, title, process, gas_id, apparatus_id, run_date, state, setup, verdict)
      SELECT 'L-' || lpad(g::text, 6, '0'), project_id, author_id, title || ' (copy ' || g || ')', process, gas_id, apparatus_id,
             run_date - (g % 300), (ARRAY['draft','submitted','approved','returned','rejected']::run_state[])[1 + g % 5], setup, verdict
      FROM runs, generate_series(1, ${10_000 - n}) g WHERE runs.id = (SELECT min(id) FROM runs)`);
  }
  const [checked] = await handle.db.select({ id: runs.id }).from(runs).where(eq(runs.state, 'submitted')).limit(1);
  const [{ total }] = await handle.db.select({ total: sql<number>`count(*)::int` }).from(runs);
  await handle.close();

  const apiEnv = { DATABASE_URL: url, QWELL_WORKER: '0' };
  // The reference: a bare Express endpoint in its own Node process, like the API's.
  const bare = spawn(process.execPath, ['-e',
    `require('express')().get('/bare', (q, r) => r.json({ status: 'ok', items: [] })).listen(${BARE_PORT}, '127.0.0.1')`,
  ], { cwd: root, stdio: ['ignore', 'ignore', 'inherit'] });
  let api = await startQwellProcess(apiEnv, API_PORT);
  const writer = createDb(url, 1);
  try {
    await waitFor(`http://127.0.0.1:${BARE_PORT}/bare`);
    const headers = await signInHeaders();
    console.log(`${total} runs stored; ${connections} connections for ${seconds} s per target; node ${process.version}; ${cpus().length} cores`);
    const bareRow = await hammer('bare Express endpoint', `http://127.0.0.1:${BARE_PORT}/bare`, BROWSER_HEADERS);
    const listUrl = `http://127.0.0.1:${API_PORT}/api/runs?pageSize=50`;
    const rows = [
      await hammer('GET /api/runs (page of 50)', listUrl, headers),
      await hammer('GET /api/runs/:id/balance', `http://127.0.0.1:${API_PORT}/api/runs/${checked.id}/balance`, headers),
    ];
    // Informative rows: runs being saved meanwhile (each save empties the read cache), and no cache at all.
    const saving = setInterval(() => {
      void writer.db.update(runs).set({ updatedAt: sql`now()` }).where(eq(runs.id, checked.id)).catch(() => undefined);
    }, 100);
    const whileSaving = await hammer('GET /api/runs while a run is saved every 100 ms', listUrl, headers);
    clearInterval(saving);
    await api.stop();
    api = await startQwellProcess({ ...apiEnv, QWELL_READ_CACHE: '0' }, API_PORT);
    const uncached = await hammer('GET /api/runs with the read cache off', listUrl, await signInHeaders());
    for (const row of [...rows, whileSaving, uncached]) {
      const share = (row['req/s'] / bareRow['req/s']) * 100;
      const judged = rows.includes(row) ? ' (target < 25 ms and ≥ 30 %)' : ' (for information)';
      console.log(`${row.target}: p95 ${row.p95} ms, ${share.toFixed(0)} % of the bare endpoint's throughput${judged}`);
    }
  } finally {
    await writer.close();
    await api.stop();
    bare.kill('SIGTERM');
  }
}

/** Signs in as the quality officer (who sees every run) and returns the cookies a browser would send. */
async function signInHeaders(): Promise<Record<string, string>> {
  const me = await fetch(`http://127.0.0.1:${API_PORT}/api/auth/me`);
  const xsrf = /XSRF-TOKEN=([^;]+)/.exec(me.headers.get('set-cookie') ?? '')![1];
  const signIn = await fetch(`http://127.0.0.1:${API_PORT}/api/auth/sign-in`, {
    method: 'POST', headers: { 'content-type': 'application/json', cookie: `XSRF-TOKEN=${xsrf}`, 'x-xsrf-token': decodeURIComponent(xsrf) },
    body: JSON.stringify({ email: demoEmail('quality'), password: DEFAULT_DEMO_PASSWORD }),
  });
  const session = /qwell_session=([^;]+)/.exec(signIn.headers.get('set-cookie') ?? '')![1];
  return { ...BROWSER_HEADERS, cookie: `qwell_session=${session}; XSRF-TOKEN=${xsrf}` };
}

main().then(() => process.exit(0), (error: unknown) => {
  console.error(error);
  process.exit(1);
});
