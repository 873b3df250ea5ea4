/** One event of the append-only, hash-chained audit trail. */
export interface AuditEvent {
  id: number;
  /** ISO timestamp. */
  occurredAt: string;
  /** null for events the system records on its own (seeding, the balance worker). */
  actorId: number | null;
  actorEmail: string | null;
  /** What happened, e.g. `run.submit`. */
  action: string;
  /** The kind of record it touched, e.g. `run`, `instrument`. */
  entityType: string;
  entityId: string;
  /** The record before and after the change; null where there is no such side. */
  before: unknown;
  after: unknown;
  /** Reason given by the person, where the action asks for one. */
  reason: string | null;
  ip: string | null;
  prevHash: string;
  hash: string;
  /** The person's name; null for events the system wrote. */
  actorName: string | null;
  /** What happened in plain words, e.g. "Submitted the run for review" (contract/audit.ts). */
  actionLabel: string;
  /** The record type as a word ("Run", "Instrument"). */
  recordType: string;
  /** The record by its code ("R-2026-0007 rev. 1", "PG-2"), or `#id` when it has none. */
  record: string;
  /** Before and after as the fields that differ; null on a side means the field was not there. */
  changes: { field: string; before: string | null; after: string | null }[];
}

/** Body of `GET /api/audit`. */
export interface AuditPage {
  items: AuditEvent[];
  total: number;
  page: number;
  pageSize: number;
}

/** The trail's filters and page, as they stand in the address. */
export interface AuditQuery {
  page: number;
  pageSize: number;
  /** Run code, e.g. R-2026-0007 (every revision), or a run id. */
  run: string | null;
  /** Leave sign-ins, sign-outs and failed sign-ins out. */
  hideSignIns: boolean;
  /** Person id of the actor. */
  person: number | null;
  action: string | null;
  entityType: string | null;
  /** ISO dates, inclusive. */
  from: string | null;
  to: string | null;
}

export type AuditFilters = Omit<AuditQuery, 'page' | 'pageSize'>;

/** Body of `GET /api/audit/verify`. */
export interface ChainCheck {
  valid: boolean;
  /** Events walked. */
  checked: number;
  /** The first event whose hash does not follow from the one before. */
  firstBroken?: { id: number; reason: string };
}

export type ExportFormat = 'xlsx' | 'csv' | 'pdf';

/** Actions the server records, offered as suggestions; any other text still filters. */
export const KNOWN_ACTIONS: readonly string[] = [
  'apparatus.change',
  'apparatus.create',
  'apparatus.update',
  'auth.account-locked',
  'auth.sign-in',
  'auth.sign-in-failed',
  'auth.sign-in-refused',
  'auth.sign-out',
  'calibration.create',
  'instrument.create',
  'mail.calibration-due',
  'person.create',
  'person.update',
  'project.create',
  'project.members',
  'run.check-failed',
  'run.checked',
  'run.create',
  'run.export',
  'run.readings-replace',
  'run.revise',
  'run.submit',
  'run.update',
  'standardization.approve',
  'seed.demo-lab',
  'seed.run',
  'signature.create',
  'signature.refused',
];

/** Record types, with the one word the page, the filters and the exports use for each. */
export const RECORD_TYPES: readonly { value: string; label: string }[] = [
  { value: 'run', label: 'Run' },
  { value: 'signature', label: 'Signature' },
  { value: 'instrument', label: 'Instrument' },
  { value: 'apparatus', label: 'Apparatus' },
  { value: 'person', label: 'Person' },
  { value: 'project', label: 'Project' },
  { value: 'import', label: 'Import' },
  { value: 'column-map', label: 'Column map' },
  { value: 'audit', label: 'Audit trail' },
];

/** A person who appears in the trail. */
export interface AuditActor {
  id: number;
  name: string;
  email: string;
}
