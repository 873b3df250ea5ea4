import { loadConfig } from '../server/config';
import { runMigrations } from './migrations';

runMigrations(loadConfig().databaseUrl).then(
  () => console.log('[db] migrations applied'),
  (error: unknown) => {
    console.error('[db] migration failed:', error instanceof Error ? error.message : error);
    process.exit(1);
  },
);
