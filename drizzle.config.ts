import { defineConfig } from 'drizzle-kit';

// Generates SQL migrations into db/migrations; they are committed and applied by db/migrate.ts.
export default defineConfig({
  dialect: 'postgresql',
  schema: './db/schema/index.ts',
  out: './db/migrations',
  dbCredentials: { url: process.env['DATABASE_URL'] ?? '' },
  strict: true,
});
