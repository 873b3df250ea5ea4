import 'reflect-metadata';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { createDb } from '../../db/client';
import { DEFAULT_DEMO_PASSWORD } from '../../db/seed/demo-lab';
import { seedDemoLab } from '../../db/seed/seed';
import { root, startServer } from './server-process';

export default async function globalSetup(): Promise<void> {
  const url = process.env['DATABASE_URL'];
  if (!url?.includes('qwell_e2e')) throw new Error('e2e tests need the fresh qwell_e2e database: run them through "npm test".');
  const handle = createDb(url, 2);
  try {
    await seedDemoLab(handle.db, DEFAULT_DEMO_PASSWORD);
  } finally {
    await handle.close();
  }
  // Many sign-ins come from one address in this run; the limiter itself has its own API test.
  const child = await startServer({ DATABASE_URL: url, QWELL_SIGNIN_RATE_LIMIT: '1000' });
  writeFileSync(join(root, '.data', 'e2e-server.pid'), String(child.pid));
}
