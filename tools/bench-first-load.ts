// First-load weight: the JS, CSS and font bytes a new visitor's browser fetches for the sign-in page
// and then the home page, in the production build served by the real server. Target ≤ 250 kB.
// Run: npx ng build --configuration production, then `npm run bench:first-load` (needs a migrated,
// empty DATABASE_URL; it seeds the demo lab and starts the server on QWELL_E2E_PORT).
import 'reflect-metadata';
import type { ChildProcess } from 'node:child_process';
import { createDb } from '../db/client';
import { DEFAULT_DEMO_PASSWORD } from '../db/seed/demo-lab';
import { seedDemoLab } from '../db/seed/seed';
import { openBrowser, screenshot } from '../e2e/support/browser';
import { startServer } from '../e2e/support/server-process';
import { signInAs } from '../e2e/support/sign-in';
import { exitWithUsageOnHelp } from './cli-help';

exitWithUsageOnHelp(__filename);

type Kind = 'script' | 'stylesheet' | 'font';
const KINDS: readonly Kind[] = ['script', 'stylesheet', 'font'];

async function main(): Promise<void> {
  const url = process.env['DATABASE_URL'];
  if (!url) throw new Error('Set DATABASE_URL to a migrated, empty database.');
  const handle = createDb(url, 2);
  try {
    await seedDemoLab(handle.db, DEFAULT_DEMO_PASSWORD);
  } finally {
    await handle.close();
  }
  const server: ChildProcess = await startServer({ DATABASE_URL: url, QWELL_SIGNIN_RATE_LIMIT: '1000' });
  // Two new visitors: the first may arrive before the server has finished packing its files.
  for (const visitor of ['first visitor after boot', 'next visitor']) {
  console.log(`-- ${visitor}`);
  const session = await openBrowser();
  try {
    const fetched: { url: string; kind: Kind; bytes: number; body: number }[] = [];
    const pending: Promise<void>[] = [];
    session.page.on('requestfinished', (request) => {
      const kind = request.resourceType() as Kind;
      if (!KINDS.includes(kind)) return;
      pending.push(request.sizes().then((s) => {
        fetched.push({ url: request.url(), kind, bytes: s.responseBodySize + s.responseHeadersSize, body: s.responseBodySize });
      }));
    });
    await signInAs(session.page, 'technician');
    await session.page.waitForLoadState('networkidle');
    await Promise.all(pending);
    await screenshot(session.page, 'first-load-home');
    const total = fetched.reduce((sum, f) => sum + f.bytes, 0);
    for (const kind of KINDS) {
      const mine = fetched.filter((f) => f.kind === kind);
      const bytes = mine.reduce((sum, f) => sum + f.bytes, 0);
      console.log(`${kind.padEnd(10)} ${String(mine.length).padStart(3)} files ${(bytes / 1000).toFixed(1).padStart(8)} kB`);
    }
    for (const f of fetched.filter((x) => x.kind === 'font')) console.log(`  font ${f.url.split('/').pop()} ${(f.bytes / 1000).toFixed(1)} kB`);
    const bodies = fetched.reduce((sum, f) => sum + f.body, 0);
    console.log(`first load (sign-in page, then home), JS + CSS + fonts as transferred: ${(total / 1000).toFixed(1)} kB with headers, ${(bodies / 1000).toFixed(1)} kB of bodies (target ≤ 250 kB)`);
  } finally {
    await session.close();
  }
  }
  server.kill('SIGTERM');
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
