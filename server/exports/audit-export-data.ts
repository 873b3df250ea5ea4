import { and, asc, gt, type SQL } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import type { Role } from '../../db/schema';
import { ROLE_LABELS } from '../core/role-labels';
import { auditEvents } from '../../db/schema';
import { readableEvents } from '../audit/audit-names';
import { readableLine, type ReadableEvent } from '../audit/audit-readable';
import type { ChainCheck } from '../audit/audit-service';
import type { CellValue } from './spreadsheet-safety';

/** Events are read in pages of this many rows, so a long trail never sits in memory at once. */
export const EXPORT_PAGE_SIZE = 5000;

/**
 * One exported event: every field the event's hash covers, so an auditor can recompute each link
 * from the file alone. The rows' SHA-256 is over the canonical JSON of an array of these objects.
 */
export interface ExportRow {
  id: number;
  occurredAt: string;
  actorId: number | null;
  actorEmail: string | null;
  action: string;
  entityType: string;
  entityId: string | null;
  reason: string | null;
  before: unknown;
  after: unknown;
  ip: string | null;
  prevHash: string;
  hash: string;
  /** Names, codes and the field-by-field change, for the readable column; not part of the rows' SHA-256. */
  readable?: ReadableEvent;
}

type EventRow = typeof auditEvents.$inferSelect;

export function toExportRow(e: EventRow): ExportRow {
  return {
    id: e.id, occurredAt: e.occurredAt.toISOString(), actorId: e.actorId, actorEmail: e.actorEmail, action: e.action,
    entityType: e.entityType, entityId: e.entityId, reason: e.reason, before: e.before ?? null, after: e.after ?? null,
    ip: e.ip, prevHash: e.prevHash, hash: e.hash,
  };
}

/** The columns of the event table, in file order. */
export const EVENT_COLUMNS = [
  'id', 'occurred at (UTC, ISO 8601)', 'actor email', 'action', 'record type', 'record id', 'reason',
  'before (JSON)', 'after (JSON)', 'prev hash', 'hash', 'actor id', 'ip', 'what happened (readable)',
] as const;

const json = (v: unknown): string | null => (v === null || v === undefined ? null : JSON.stringify(v));

/** The cells of one event row (text is neutralised by the writer, numbers stay numbers). */
export function eventCells(r: ExportRow): CellValue[] {
  return [
    r.id, r.occurredAt, r.actorEmail, r.action, r.entityType, r.entityId, r.reason, json(r.before), json(r.after), r.prevHash, r.hash, r.actorId, r.ip,
    r.readable ? readableLine(r.readable, r.actorEmail) : null,
  ];
}

/** The same pages with names, codes and changes looked up for the readable column (one lookup per page). */
export async function* withReadable(db: DbOrTx, pages: AsyncIterable<ExportRow[]>): AsyncGenerator<ExportRow[]> {
  for await (const page of pages) {
    const named = await readableEvents(db, page);
    yield page.map((row, i) => {
      const { actorName, actionLabel, recordType, record, changes } = named[i];
      return { ...row, readable: { actorName, actionLabel, recordType, record, changes } };
    });
  }
}

/** Pages through the filtered events in chain (id) order. */
export async function* eventPages(db: DbOrTx, where: SQL | undefined, pageSize = EXPORT_PAGE_SIZE): AsyncGenerator<ExportRow[]> {
  let afterId = 0;
  for (;;) {
    const page = await db.select().from(auditEvents)
      .where(where ? and(where, gt(auditEvents.id, afterId)) : gt(auditEvents.id, afterId))
      .orderBy(asc(auditEvents.id)).limit(pageSize);
    if (page.length === 0) return;
    yield page.map(toExportRow);
    afterId = page[page.length - 1].id;
    if (page.length < pageSize) return;
  }
}

/** What the header block of every audit export states. */
export interface AuditExportHeader {
  lab: string;
  filters: Record<string, string | number>;
  generatedAt: Date;
  generatedBy: { name: string; email: string; role: string };
  chain: ChainCheck;
  rows: number;
  rowsSha256: string;
}

export function filtersText(filters: Record<string, string | number>): string {
  const entries = Object.entries(filters);
  return entries.length === 0 ? 'none (the whole trail)' : entries.map(([k, v]) => `${k}=${v}`).join('; ');
}

export function chainText(chain: ChainCheck): string {
  const links = chain.brokenCount === 0
    ? `every one of the ${chain.checked} events of the whole trail links to the one before it and matches its hash`
    : `${chain.brokenCount} of the ${chain.checked} events do not hold, the first at event ${chain.firstBroken!.id}: ${chain.firstBroken!.reason}` +
      (chain.broken.length > 1 ? ` (events ${chain.broken.map((b) => b.id).join(', ')}${chain.brokenCount > chain.broken.length ? ', …' : ''})` : '');
  const cp = chain.checkpoint;
  const anchor = !cp
    ? 'no signed checkpoint taken yet'
    : cp.holds
      ? `it reaches the signed checkpoint of ${cp.takenAt} (${cp.eventCount} events, newest event ${cp.headId})`
      : cp.reason!;
  return `${chain.valid ? 'VALID' : 'BROKEN'}: ${links}; ${anchor}`;
}

/** The checkpoint the export was compared with, so a reader can compare later copies with it. */
export function checkpointText(chain: ChainCheck): string {
  const cp = chain.checkpoint;
  if (!cp) return 'none';
  return `#${cp.id} taken ${cp.takenAt}: ${cp.eventCount} events, newest event ${cp.headId} with hash ${cp.headHash}; Ed25519 signature ${cp.signature} (key ${cp.keyId})`;
}

export const ROWS_HASH_METHOD =
  'SHA-256 of the canonical JSON (keys sorted, no whitespace) of the array of exported events in id order, each ' +
  '{id, occurredAt, actorId, actorEmail, action, entityType, entityId, reason, before, after, ip, prevHash, hash} with before/after as JSON values, ' +
  'taken before spreadsheet neutralisation';

export const NEUTRALISE_NOTE =
  'Text cells that begin with = + - @ tab or carriage return carry a leading \' added by this export so that no spreadsheet runs them as formulas; ' +
  'in the CSV every text field is quoted, and a \' is also added after a separator (, ; tab) or quote inside a field where a formula would start, ' +
  'for spreadsheets that split fields at another separator.';

/** The header block as label/value pairs, the same in every format. */
export function headerLines(h: AuditExportHeader): [string, string][] {
  return [
    ['Export', 'Qwell audit trail export'],
    ['Lab', h.lab],
    ['Filters', filtersText(h.filters)],
    ['Generated at', h.generatedAt.toISOString()],
    ['Generated by', `${h.generatedBy.name} <${h.generatedBy.email}> (${ROLE_LABELS[h.generatedBy.role as Role] ?? h.generatedBy.role})`],
    ['Chain verification (whole trail)', chainText(h.chain)],
    ['Signed checkpoint', checkpointText(h.chain)],
    ['Events exported', String(h.rows)],
    ['Rows SHA-256', h.rowsSha256],
    ['Rows SHA-256 method', ROWS_HASH_METHOD],
    ['File SHA-256', 'sent with the download (Content-Digest and X-Qwell-Export-SHA256) and recorded in the audit.export event written after this file'],
    ['Note', NEUTRALISE_NOTE],
  ];
}
