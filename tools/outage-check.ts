// Database outage drill (issue: faults): starts an API process on the shared loopback cluster, stops
// PostgreSQL, checks that /api/health reports the outage, starts PostgreSQL again and checks that the
// process reconnects. Repeats ROUNDS times (default 5) and prints each step. Run: npm run outage-check.
// It stops the cluster: never run it while tests or other work use the database.
import { execFileSync } from 'node:child_process';
import { join } from 'node:path';
import { ApiClient } from '../testing/api-harness';
import { startQwellProcess } from '../testing/qwell-process';

const root = join(__dirname, '..');
const pg = (cmd: string) => execFileSync('bash', [join(root, 'tools', 'pg'), cmd], { stdio: 'ignore' });

async function health(url: string): Promise<string> {
  try {
    const res = await fetch(`${url}/api/health`);
    return `${res.status} ${await res.text()}`;
  } catch (error) {
    return `no answer (${String((error as Error).cause ?? error)})`;
  }
}

/** A sign-in while the database is down: its status and how long the answer took (it must be a fast 503, not a hang). */
async function timedSignIn(url: string): Promise<string> {
  const started = performance.now();
  const res = await new ApiClient(url).signIn('nobody@qwell.invalid', 'not a password');
  return `${res.status} in ${(performance.now() - started).toFixed(0)} ms`;
}

async function main(): Promise<void> {
  const rounds = Number(process.argv[2] ?? 5);
  let failures = 0;
  for (let round = 1; round <= rounds; round++) {
    const api = await startQwellProcess({ DATABASE_URL: process.env['DATABASE_URL']!, QWELL_WORKER: '0' });
    try {
      const before = await health(api.url);
      pg('down');
      const during = await health(api.url);
      const signIn = await timedSignIn(api.url);
      pg('up');
      let after = '';
      for (let i = 0; i < 60 && !after.startsWith('200'); i++) {
        await new Promise((r) => setTimeout(r, 250));
        after = await health(api.url);
      }
      const ok = before.startsWith('200') && during.startsWith('503') && signIn.startsWith('503') && after.startsWith('200');
      if (!ok) failures += 1;
      console.log(`round ${round}: ${ok ? 'ok' : 'FAILED'}\n  before: ${before}\n  during: ${during}\n  sign-in during: ${signIn}\n  after:  ${after}`);
      if (!ok) console.log(`  the API process (${api.child.exitCode === null && api.child.signalCode === null ? 'running' : `exited: ${api.child.exitCode ?? api.child.signalCode}`}) said:\n${api.output.join('').trimEnd()}`);
    } finally {
      pg('up');
      await api.stop('SIGKILL');
    }
  }
  console.log(`\n${rounds - failures} of ${rounds} rounds reported the outage and reconnected`);
  process.exit(failures ? 1 : 0);
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
