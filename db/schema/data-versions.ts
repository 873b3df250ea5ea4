import { bigint, pgTable, text } from 'drizzle-orm/pg-core';

/**
 * Version counters of groups of tables. A deferred trigger (see migration 0004) adds one to
 * "records" when a transaction that changed runs, results, people, projects or memberships
 * commits; the API keeps answers to frequent reads while the counter it reads stays the same.
 */
export const dataVersions = pgTable('data_versions', {
  name: text('name').primaryKey(),
  version: bigint('version', { mode: 'number' }).notNull().default(0),
});
