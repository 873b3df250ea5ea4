import { createDb } from '../client';
import { loadConfig } from '../../server/config';
import { DEFAULT_DEMO_PASSWORD, DEMO_INSTITUTION, demoEmail, demoPeople } from './demo-lab';
import { seedDemoLab } from './seed';

function printSignIns(): void {
  const shown = process.env['QWELL_DEMO_PASSWORD'] ? '(the value of QWELL_DEMO_PASSWORD)' : DEFAULT_DEMO_PASSWORD;
  console.log(`\nDemo sign-ins at http://127.0.0.1:${process.env['PORT'] ?? 3000} (password for all: ${shown}):`);
  for (const p of demoPeople) console.log(`  ${p.role.padEnd(13)} ${demoEmail(p.role).padEnd(38)} ${p.name}`);
  console.log('The password is the one set when the demo lab was first loaded.\n');
}

async function main(): Promise<void> {
  // tools/start prints the sign-ins again just before serving, after the build output.
  if (process.argv.includes('--sign-ins')) return printSignIns();
  const password = process.env['QWELL_DEMO_PASSWORD'] || DEFAULT_DEMO_PASSWORD;
  const handle = createDb(loadConfig().databaseUrl, 2);
  try {
    const loaded = await seedDemoLab(handle.db, password);
    console.log(loaded ? `[seed] demo lab loaded: ${DEMO_INSTITUTION}` : '[seed] data present: the demo lab is not loaded again');
  } finally {
    await handle.close();
  }
}

main().catch((error: unknown) => {
  console.error('[seed] failed:', error instanceof Error ? error.message : error);
  process.exit(1);
});
