import { migrate } from 'drizzle-orm/postgres-js/migrator';
import { join } from 'node:path';
import { createDb } from './client';

/** Applies the committed migrations; safe to run again. */
export async function runMigrations(url: string): Promise<void> {
  const handle = createDb(url, 1);
  try {
    await migrate(handle.db, { migrationsFolder: join(__dirname, 'migrations') });
  } finally {
    await handle.close();
  }
}
