// Bulk readings benchmark (issue 16): a real API process on the database in DATABASE_URL (a fresh one:
// `npm run bench:readings` makes qwell_test_readings). It
//   1. stores N readings (default 10⁶; time + pressure, volume, temperature) with one PUT /api/runs/:id/readings,
//   2. checks a run document of M readings (default 550 000) with one POST /api/balance,
// while /api/health is asked every 20 ms; prints wall time, the server's peak RSS (VmHWM) and the
// health answers' p50/p99/max for each (and for 5 s with the server idle, as the machine's own baseline).
// Targets: store < 10 s and < 400 MB; health p99 < 100 ms.
//   npx tsx --tsconfig tsconfig.server.json tools/bench-readings.ts [N] [M]
import 'reflect-metadata';
import bcrypt from 'bcryptjs';
import { readFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import postgres from 'postgres';
import { ApiClient } from '../testing/api-harness';
import { startQwellProcess, type QwellProcess } from '../testing/qwell-process';

const root = join(__dirname, '..');
const N = Number(process.argv[2] ?? 1_000_000);
const M = Number(process.argv[3] ?? 550_000);
const EMAIL = 'bench.technician@fuzz.test';
const PASSWORD = 'bench readings password';

function peakRssMb(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  return Number(/VmHWM:\s+(\d+) kB/.exec(status)?.[1] ?? NaN) / 1024;
}

/** Asks /api/health every 20 ms until stopped; returns the answers' durations in ms. */
function pollHealth(url: string): { stop: () => Promise<number[]> } {
  const times: number[] = [];
  let running = true;
  const loop = (async () => {
    while (running) {
      const started = performance.now();
      await fetch(`${url}/api/health`).then((r) => r.arrayBuffer()).catch(() => undefined);
      times.push(performance.now() - started);
      await new Promise((r) => setTimeout(r, 20));
    }
  })();
  return { stop: async () => { running = false; await loop; return times; } };
}

const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))] : NaN;
};
const healthLine = (xs: number[]) => `health ${xs.length} answers: p50 ${pct(xs, 50).toFixed(1)} ms, p99 ${pct(xs, 99).toFixed(1)} ms, max ${Math.max(...xs).toFixed(1)} ms`;

/** Invented, smooth readings of an isothermal expansion (nitrogen, 50 mmol at 300 K), sampled evenly. */
function readingsBody(n: number) {
  const time: number[] = new Array(n);
  const pressure: number[] = new Array(n);
  const volume: number[] = new Array(n);
  const temperature: number[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const t = (i * 200) / n;
    const v = 1.0 + 0.5 * (t / 200);
    time[i] = +t.toFixed(6);
    volume[i] = +v.toFixed(6);
    pressure[i] = +((0.05 * 8.314462618 * 300) / (v / 1000) / 1000).toFixed(4);
    temperature[i] = +(26.85 + 0.01 * Math.sin(t)).toFixed(4);
  }
  return { time: { unit: 's', values: time }, channels: { pressure: { unit: 'kPa', values: pressure, reference: 'absolute' }, volume: { unit: 'L', values: volume }, temperature: { unit: 'degC', values: temperature } } };
}

async function main(): Promise<void> {
  const url = process.env['DATABASE_URL']!;
  const sql = postgres(url, { max: 1, onnotice: () => undefined });
  const [person] = await sql`INSERT INTO people (email, name, role, password_hash) VALUES (${EMAIL}, 'Bench technician', 'technician', ${bcrypt.hashSync(PASSWORD, 4)})
    ON CONFLICT (email) DO UPDATE SET name = EXCLUDED.name RETURNING id`;
  const [project] = await sql`INSERT INTO projects (code, name) VALUES (${`BR${Date.now() % 100000}`}, 'Bench readings') RETURNING id`;
  await sql`INSERT INTO project_members (project_id, person_id) VALUES (${project.id}, ${person.id})`;
  await sql.end();

  let api: QwellProcess | undefined;
  try {
    api = await startQwellProcess({ DATABASE_URL: url, QWELL_WORKER: '0', LOG_LEVEL: 'warn' }, process.env['QWELL_BENCH_PORT'] ? Number(process.env['QWELL_BENCH_PORT']) : undefined);
    const pid = api.child.pid!;
    const client = new ApiClient(api.url);
    if ((await client.signIn(EMAIL, PASSWORD)).status !== 200) throw new Error('bench sign-in failed');
    console.log(`load average ${loadavg().map((l) => l.toFixed(1)).join(', ')} on this machine`);
    console.log(`server after start: peak RSS ${peakRssMb(pid).toFixed(0)} MB`);

    const created = await client.post('/api/runs', { projectId: project.id, title: 'Bench: a million readings', process: 'isothermal', runDate: '2026-03-14', setup: { gas: { model: 'species', species: 'N2' }, amount: { from: 'moles', value: 0.05 } } });
    if (created.status !== 201) throw new Error(`create: ${created.status} ${JSON.stringify(created.body)}`);
    const body = JSON.stringify({ version: created.body.version, ...readingsBody(N) });
    console.log(`PUT body: ${(body.length / 1024 / 1024).toFixed(1)} MB of JSON, ${N} readings × 4 columns`);
    // The same health requests with nothing else asked of the server: what the machine's load alone gives.
    const idle = pollHealth(api.url);
    await new Promise((r) => setTimeout(r, 5000));
    console.log(`idle for 5 s: ${healthLine(await idle.stop())}`);
    const health = pollHealth(api.url);
    const started = performance.now();
    const put = await client.agent.put(`/api/runs/${created.body.id}/readings`).set('X-XSRF-TOKEN', client.xsrfToken).set('Content-Type', 'application/json').send(body);
    const seconds = (performance.now() - started) / 1000;
    const h1 = await health.stop();
    if (put.status !== 200) throw new Error(`PUT: ${put.status} ${JSON.stringify(put.body).slice(0, 500)}`);
    console.log(`store ${put.body.readings} readings: ${seconds.toFixed(2)} s, server peak RSS ${peakRssMb(pid).toFixed(0)} MB; ${healthLine(h1)}`);

    const doc = JSON.parse(readFileSync(join(root, 'fixtures/runs/isothermal.json'), 'utf8'));
    const big = readingsBody(M);
    doc.readings = { time: big.time, pressure: { ...big.channels.pressure, instrument: doc.readings.pressure.instrument }, volume: big.channels.volume, temperature: { ...big.channels.temperature, instrument: doc.readings.temperature.instrument } };
    doc.gas = { model: 'species', species: 'N2' };
    doc.amount = { from: 'moles', value: 0.05 };
    doc.process = { claimed: 'isothermal' };
    doc.apparatus = {};
    const checkBody = JSON.stringify(doc);
    const health2 = pollHealth(api.url);
    const started2 = performance.now();
    const check = await client.agent.post('/api/balance').set('X-XSRF-TOKEN', client.xsrfToken).set('Content-Type', 'application/json').send(checkBody);
    const seconds2 = (performance.now() - started2) / 1000;
    const h2 = await health2.stop();
    console.log(`balance check of ${M} readings: ${check.status} in ${seconds2.toFixed(2)} s, server peak RSS ${peakRssMb(pid).toFixed(0)} MB; ${healthLine(h2)}`);
    if (check.status !== 200) console.log(JSON.stringify(check.body).slice(0, 600));
  } finally {
    await api?.stop('SIGKILL');
  }
}

main().then(() => process.exit(0), (error: unknown) => {
  console.error(error);
  process.exit(1);
});
