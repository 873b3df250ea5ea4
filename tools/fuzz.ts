// The large fuzz run (issue: ≥ 10 000 cases): random and near-miss JSON against every write route on
// a fresh database. Run with `npm run fuzz [-- CASES]`; prints failures and a summary; exit 1 on any.
import 'reflect-metadata';
import { eq } from 'drizzle-orm';
import fc from 'fast-check';
import { apparatus, instruments, people, projects, runs } from '../db/schema';
import { fuzzOnce, fuzzTargets, payload, type FuzzFailure } from '../server/security/fuzz-writes';
import { clientAs, startHarness } from '../server/testing/api-harness';

async function main(): Promise<void> {
  const total = Number(process.argv[2] ?? 10_000);
  const perRoute = Math.ceil(total / fuzzTargets.length);
  const h = await startHarness();
  const first = async (state: 'draft' | 'submitted' | 'approved') => (await h.handle.db.select({ id: runs.id }).from(runs).where(eq(runs.state, state)).limit(1))[0].id;
  const ids: Record<string, number> = {
    ':draft': await first('draft'), ':submitted': await first('submitted'), ':approved': await first('approved'),
    ':instrument': (await h.handle.db.select({ id: instruments.id }).from(instruments).limit(1))[0].id,
    ':apparatus': (await h.handle.db.select({ id: apparatus.id }).from(apparatus).limit(1))[0].id,
    ':person': (await h.handle.db.select({ id: people.id }).from(people).where(eq(people.role, 'technician')).limit(1))[0].id,
    ':project': (await h.handle.db.select({ id: projects.id }).from(projects).limit(1))[0].id,
  };
  const failures: FuzzFailure[] = [];
  const started = Date.now();
  let cases = 0;
  for (const target of fuzzTargets) {
    const client = await clientAs(h.app, target.role);
    const url = target.path.replace(/:[a-z]+/g, (p) => String(ids[p]));
    const statuses = new Map<number, number>();
    const samples = fc.sample(payload, { numRuns: perRoute, seed: 7 + cases });
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
