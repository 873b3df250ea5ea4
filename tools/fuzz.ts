// The large fuzz run (issue: ≥ 10 000 cases): random JSON, and near-valid payloads (a route's valid
// payload with one field changed, dropped or added), against every write route on
// a fresh database; then the hostile families (control characters, deep nesting, overflow after SI,
// wrong nested types, prototype keys), a tenth as many again, sent in parallel (QWELL_FUZZ_PARALLEL, default 8);
// then each route's valid payload sent QWELL_FUZZ_PARALLEL times at once. QWELL_FUZZ_ROUTES=TEXT keeps
// only the routes whose "METHOD /path" contains TEXT (CASES are then spread over those). Run with
// `npm run fuzz [-- CASES]`; prints failures and a summary; exit 1 on any.
import 'reflect-metadata';
import fc from 'fast-check';
import { fuzzClients, fuzzOnce, fuzzParams, fuzzTargets as allTargets, hostileFamilies, nextFuzzUrl, payloadsFor, sendOnce, type FuzzFailure } from '../testing/fuzz-writes';
import { startHarness } from '../testing/api-harness';

const only = process.env['QWELL_FUZZ_ROUTES'];
const fuzzTargets = only ? allTargets.filter((t) => `${t.method} ${t.path}`.includes(only)) : allTargets;

async function main(): Promise<void> {
  if (fuzzTargets.length === 0) throw new Error(`QWELL_FUZZ_ROUTES="${only}" matches no route of the fuzz table`);
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
    const statuses = new Map<number, number>();
    const samples = fc.sample(payloadsFor(target, ids), { numRuns: perRoute, seed: 7 + cases });
    for (const body of samples) {
      const seen = new Set<number>();
      const url = await nextFuzzUrl(h.handle.db, target, ids);
      const failure = await fuzzOnce(h.handle.db, client, target.method, url, body, seen);
      for (const s of seen) statuses.set(s, (statuses.get(s) ?? 0) + 1);
      if (failure) failures.push(failure);
      cases += 1;
    }
    console.log(`${`${target.method} ${target.path}`.padEnd(48)} ${perRoute} cases  statuses ${JSON.stringify(Object.fromEntries(statuses))}`);
  }
  // The hostile families of issue 16, sent PARALLEL requests at a time (no row-count check: the
  // requests overlap; the bar is no 5xx, and no acceptance of a family that is never valid). Counted per family over every route.
  const PARALLEL = Number(process.env['QWELL_FUZZ_PARALLEL'] ?? 8);
  const perFamily = Number(process.env['QWELL_FUZZ_HOSTILE'] ?? Math.ceil(total / 10 / fuzzTargets.length));
  const families = new Map<string, { cases: number; statuses: Map<number, number> }>();
  const hostileStarted = Date.now();
  const NEVER_VALID = ['deep nesting', 'prototype key', 'control character', 'huge string'];
  for (const target of fuzzTargets) {
    const client = clients[target.actor];
    const jobs: Array<[string, unknown]> = [];
    for (const [family, arbitrary] of Object.entries(hostileFamilies(target.valid(ids)))) {
      for (const body of fc.sample(arbitrary, { numRuns: perFamily, seed: 16 + jobs.length })) jobs.push([family, body]);
    }
    for (let i = 0; i < jobs.length; i += PARALLEL) {
      await Promise.all(jobs.slice(i, i + PARALLEL).map(async ([family, body]) => {
        const url = await nextFuzzUrl(h.handle.db, target, ids);
        const res = await sendOnce(h.handle.db, client, target.method, url, body);
        const entry = families.get(family) ?? { cases: 0, statuses: new Map<number, number>() };
        entry.cases += 1;
        entry.statuses.set(res.status, (entry.statuses.get(res.status) ?? 0) + 1);
        families.set(family, entry);
        if (res.status >= 500) failures.push({ route: `${target.method} ${target.path} [${family}]`, status: res.status, body: res.body, payload: res.sent });
        // These families are never valid: 64 KiB of text is past every text field's limit (contract/text-limits.ts).
        else if (res.status < 400 && NEVER_VALID.includes(family)) failures.push({ route: `${target.method} ${target.path} [${family}]`, status: res.status, body: res.body, payload: res.sent });
        cases += 1;
      }));
    }
  }
  console.log(`\nhostile families, ${PARALLEL} requests in parallel, every route (${((Date.now() - hostileStarted) / 1000).toFixed(1)} s):`);
  for (const [family, { cases: n, statuses }] of families) console.log(`${family.padEnd(24)} ${String(n).padStart(6)} cases  statuses ${JSON.stringify(Object.fromEntries(statuses))}`);
  // The same valid request PARALLEL times at once, on fresh records (a double click, a retried commit).
  const fresh = await fuzzParams(h.handle.db);
  const freshClients = await fuzzClients(h.app, h.handle.db, fresh);
  console.log(`\nthe valid payload, ${PARALLEL} identical requests at once:`);
  for (const target of fuzzTargets) {
    const url = await nextFuzzUrl(h.handle.db, target, fresh);
    const answers = await Promise.all(Array.from({ length: PARALLEL }, () => sendOnce(h.handle.db, freshClients[target.actor], target.method, url, target.valid(fresh))));
    const statuses = new Map<number, number>();
    for (const res of answers) {
      statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
      if (res.status >= 500) failures.push({ route: `${target.method} ${target.path} [identical, parallel]`, status: res.status, body: res.body, payload: res.sent });
      cases += 1;
    }
    console.log(`${`${target.method} ${target.path}`.padEnd(48)} statuses ${JSON.stringify(Object.fromEntries(statuses))}`);
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
