import {
  bigserial, boolean, date, doublePrecision, index, integer, jsonb, pgEnum, pgTable, primaryKey, serial, text, timestamp, uniqueIndex,
} from 'drizzle-orm/pg-core';
import { apparatus, gases } from './equipment';
import { bytea } from './bytea';
import { people, projects } from './people';
import { RUN_PROCESSES, RUN_STATES, VERDICTS, type ReviewAction, type RunState } from '../../contract/runs';

// The enums take their values from the contract the client shares (contract/runs.ts).
export const runStates = RUN_STATES;
export type { RunState };
export const runStateEnum = pgEnum('run_state', runStates);

export const processes = RUN_PROCESSES;
export const processEnum = pgEnum('process', processes);

export const verdicts = VERDICTS;
export const verdictEnum = pgEnum('verdict', verdicts);

export const runs = pgTable(
  'runs',
  {
    id: serial('id').primaryKey(),
    /** People-facing reference, e.g. R-2026-0007; revisions share it. */
    code: text('code').notNull(),
    revision: integer('revision').notNull().default(1),
    /** The revision this one corrects, if any. */
    previousRevisionId: integer('previous_revision_id'),
    revisionReason: text('revision_reason'),
    projectId: integer('project_id').notNull().references(() => projects.id),
    authorId: integer('author_id').notNull().references(() => people.id),
    title: text('title').notNull(),
    process: processEnum('process').notNull(),
    gasId: integer('gas_id').references(() => gases.id),
    apparatusId: integer('apparatus_id').references(() => apparatus.id),
    runDate: date('run_date').notNull(),
    state: runStateEnum('state').notNull().default('draft'),
    /** Optimistic concurrency: every edit must quote the version it read. */
    version: integer('version').notNull().default(1),
    /** Everything of the run document except its readings (amount, ambient, channels, instruments). */
    setup: jsonb('setup').$type<Record<string, unknown>>().notNull().default({}),
    /** Latest engine verdict, copied here for list queries. */
    verdict: verdictEnum('verdict'),
    returnReason: text('return_reason'),
    submittedAt: timestamp('submitted_at', { withTimezone: true }),
    decidedAt: timestamp('decided_at', { withTimezone: true }),
    /** Last change of the run's content (not of its state): a result older than this is stale. */
    editedAt: timestamp('edited_at', { withTimezone: true }).notNull().defaultNow(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('runs_code_revision_idx').on(t.code, t.revision),
    index('runs_state_updated_idx').on(t.state, t.updatedAt),
    // The list's default order (newest change first, id as tie-break) and its other sort keys.
    // Plain ascending: scanned backwards it serves ORDER BY updated_at DESC, id DESC (NULLS FIRST).
    index('runs_updated_idx').on(t.updatedAt, t.id),
    index('runs_created_idx').on(t.createdAt),
    index('runs_run_date_idx').on(t.runDate),
    index('runs_project_idx').on(t.projectId, t.updatedAt),
    index('runs_author_idx').on(t.authorId, t.updatedAt),
  ],
);

/**
 * One time point of a run in SI units: s since the first reading, Pa, m³, m, K, V, A, W. Pressure keeps
 * the reference it was entered in (absolute or gauge, in runs.setup), because a draft may not have its
 * barometric reading yet; the entered unit of every channel lives in runs.setup too.
 */
export const readings = pgTable(
  'readings',
  {
    // No row-level foreign key: its check runs once per reading (three quarters of a 10⁶-reading COPY's
    // time). Statement-level triggers (migration readings_run_check) check that the run exists once per
    // statement and delete a deleted run's readings, as the foreign key's ON DELETE CASCADE did.
    runId: integer('run_id').notNull(),
    seq: integer('seq').notNull(),
    time: doublePrecision('time').notNull(),
    pressure: doublePrecision('pressure'),
    volume: doublePrecision('volume'),
    displacement: doublePrecision('displacement'),
    temperature: doublePrecision('temperature'),
    voltage: doublePrecision('voltage'),
    current: doublePrecision('current'),
    power: doublePrecision('power'),
  },
  (t) => [primaryKey({ columns: [t.runId, t.seq] })],
);

/** What the engine said about one version of a run. Old results stay; `current` marks the latest. */
export const balanceResults = pgTable(
  'balance_results',
  {
    id: serial('id').primaryKey(),
    runId: integer('run_id').notNull().references(() => runs.id, { onDelete: 'cascade' }),
    runVersion: integer('run_version').notNull(),
    engineVersion: text('engine_version').notNull(),
    inputHash: text('input_hash').notNull(),
    verdict: verdictEnum('verdict').notNull(),
    en: doublePrecision('en'),
    residual: doublePrecision('residual').notNull(),
    expandedUncertainty: doublePrecision('expanded_uncertainty').notNull(),
    result: jsonb('result').$type<Record<string, unknown>>().notNull(),
    current: boolean('current').notNull().default(true),
    computedAt: timestamp('computed_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('balance_results_run_idx').on(t.runId, t.computedAt)],
);

/** An electronic signature: who signed what (by hash), when, and what the signature means. */
export const signatures = pgTable(
  'signatures',
  {
    id: serial('id').primaryKey(),
    runId: integer('run_id').notNull().references(() => runs.id),
    signerId: integer('signer_id').notNull().references(() => people.id),
    action: text('action').$type<ReviewAction>().notNull(),
    meaning: text('meaning').notNull(),
    reason: text('reason'),
    /** SHA-256 of the canonical run and result that were signed. */
    signedHash: text('signed_hash').notNull(),
    signedAt: timestamp('signed_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('signatures_run_idx').on(t.runId)],
);

/** An uploaded logger file, kept as it came with its SHA-256. */
export const uploads = pgTable(
  'uploads',
  {
    id: serial('id').primaryKey(),
    sha256: text('sha256').notNull(),
    filename: text('filename').notNull(),
    mediaType: text('media_type').notNull(),
    size: integer('size').notNull(),
    content: bytea('content').notNull(),
    uploadedBy: integer('uploaded_by').notNull().references(() => people.id),
    runId: integer('run_id').references(() => runs.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('uploads_sha256_idx').on(t.sha256)],
);

/** Mail waiting to go out; written in the same transaction as the change that caused it. */
export const mailOutbox = pgTable(
  'mail_outbox',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    recipient: text('recipient').notNull(),
    subject: text('subject').notNull(),
    body: text('body').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    // What the mail is about (e.g. one run version's verdict): a second mail with the same key to the
    // same address is not queued, however many checks of that version run, in sequence or at once.
    dedupeKey: text('dedupe_key'),
  },
  (t) => [index('mail_outbox_unsent_idx').on(t.sentAt, t.id), uniqueIndex('mail_outbox_dedupe_idx').on(t.dedupeKey, t.recipient)],
);
