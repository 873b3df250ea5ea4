import { loadConfig, ownerDatabaseUrl } from '../server/config';
import { runMigrations } from './migrations';

// Migrations run as the owner role (DATABASE_OWNER_URL, or the loopback cluster's owner on
// DATABASE_URL's database); the runtime role named by DATABASE_URL gets its grants afterwards.
const runtimeRole = decodeURIComponent(new URL(loadConfig().databaseUrl).username) || 'qwell';
runMigrations(ownerDatabaseUrl(), runtimeRole).then(
  () => console.log(`[db] migrations applied; runtime role ${runtimeRole} granted its rights`),
  (error: unknown) => {
    console.error('[db] migration failed:', error instanceof Error ? error.message : error);
    process.exit(1);
  },
);
