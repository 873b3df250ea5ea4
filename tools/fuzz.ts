// The large fuzz run (issue: ≥ 10 000 cases): random JSON, and near-valid payloads (a route's valid
// payload with one field changed, dropped or added), against every write route on
// a fresh database. Run with `npm run fuzz [-- CASES]`; prints failures and a summary; exit 1 on any.
import 'reflect-metadata';
import fc from 'fast-check';
import { fuzzClients, fuzzOnce, fuzzParams, fuzzTargets, fuzzUrl, payloadsFor, type FuzzFailure } from '../server/security/fuzz-writes';
import { startHarness } from '../server/testing/api-harness';

async function main(): Promise<void> {
  const total = Number(process.argv[2] ?? 10_000);
  const perRoute = Math.ceil(total / fuzzTargets.length);
  const h = await startHarness();
  const ids = await fuzzParams(h.handle.db);
  const clients = await fuzzClients(h.app, h.handle.db, ids);
  const failures: FuzzFailure[] = [];
  const started = Date.now();
  let cases = 0;
  for (const target of fuzzTargets) {
    const client = clients[target.actor];
    const url = fuzzUrl(target, ids);
    const statuses = new Map<number, number>();
    const samples = fc.sample(payloadsFor(target, ids), { numRuns: perRoute, seed: 7 + cases });
    for (const body of samples) {
      const seen = new Set<number>();
      const failure = await fuzzOnce(h.handle.db, client, target.method, url, body, seen);
      for (const s of seen) statuses.set(s, (statuses.get(s) ?? 0) + 1);
      if (failure) failures.push(failure);
      cases += 1;
    }
    console.log(`${`${target.method} ${target.path}`.padEnd(48)} ${perRoute} cases  statuses ${JSON.stringify(Object.fromEntries(statuses))}`);
  }
  await h.close();
  console.log(`\n${cases} cases in ${((Date.now() - started) / 1000).toFixed(1)} s; ${failures.length} failure(s)`);
  for (const f of failures.slice(0, 20)) console.log(JSON.stringify(f));
  process.exit(failures.length ? 1 : 0);
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
