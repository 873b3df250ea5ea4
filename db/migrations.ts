import { migrate } from 'drizzle-orm/postgres-js/migrator';
import { join } from 'node:path';
import { createDb } from './client';
import { grantRuntimeRights } from './runtime-role';

/**
 * Applies the committed migrations as the owner role, then grants the runtime role (the app's) its
 * rights (db/runtime-role.ts); safe to run again.
 */
export async function runMigrations(ownerUrl: string, runtimeRole: string): Promise<void> {
  const handle = createDb(ownerUrl, 1);
  try {
    await migrate(handle.db, { migrationsFolder: join(__dirname, 'migrations') });
    await grantRuntimeRights(handle.sql, runtimeRole);
  } finally {
    await handle.close();
  }
}
