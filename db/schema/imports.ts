import { index, integer, jsonb, pgTable, serial, text, timestamp } from 'drizzle-orm/pg-core';
import { people } from './people';
import { runs, uploads } from './runs';

/**
 * A saved column map: how one logger's spreadsheet columns map to Qwell's channels and units, so the
 * next file from the same logger needs no mapping by hand.
 */
export const columnMaps = pgTable('column_maps', {
  id: serial('id').primaryKey(),
  name: text('name').notNull(),
  ownerId: integer('owner_id').notNull().references(() => people.id),
  /** The header row it was made from, to suggest it when the same headers come again. */
  headers: jsonb('headers').$type<string[]>().notNull(),
  mapping: jsonb('mapping').$type<Record<string, unknown>>().notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

/** One upload on its way in: previewed, then committed all-or-nothing into a run. */
export const imports = pgTable(
  'imports',
  {
    id: serial('id').primaryKey(),
    uploadId: integer('upload_id').notNull().references(() => uploads.id),
    status: text('status').notNull().default('previewed'),
    createdBy: integer('created_by').notNull().references(() => people.id),
    /** Parsed table, kept between preview and commit so the file is read once. */
    parsed: jsonb('parsed').$type<Record<string, unknown>>().notNull(),
    mapping: jsonb('mapping').$type<Record<string, unknown>>(),
    runId: integer('run_id').references(() => runs.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    committedAt: timestamp('committed_at', { withTimezone: true }),
  },
  (t) => [index('imports_created_by_idx').on(t.createdBy, t.createdAt)],
);
