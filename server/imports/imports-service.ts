import { createHash } from 'node:crypto';
import { safeFilename } from './safe-filename';
import { and, asc, desc, eq, inArray, isNotNull, or, type SQL } from 'drizzle-orm';
import type { Database, DbOrTx } from '../../db/client';
import { columnMaps, imports, people, runs, uploads } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import type { SessionPerson } from '../core/session';
import { visibleProjectIds } from '../runs/run-access';
import { readCsv, type CsvOptions } from './csv-reader';
import { detectKind } from './file-kind';
import { commitImport, loadOwnImport } from './import-commit';
import type { ImportLimits } from './import-limits';
import { buildPreview, type ImportPreview } from './import-preview';
import type { ColumnMapDto, CommitBody } from './imports-dto';
import { parseMapping } from './imports-dto';
import { checkMapping, checkRows, type ImportMapping } from './row-validation';
import { buildTable, type ParsedTable } from './table-builder';
import { readWorkbook } from './xlsx-off-thread';

export interface UploadedFile {
  originalname: string;
  mimetype: string;
  buffer: Buffer;
}

const normalHeaders = (headers: readonly string[]) => headers.map((h) => h.trim().toLowerCase().replace(/\s+/g, ' '));

export class ImportsService {
  constructor(private readonly db: Database, private readonly limits: ImportLimits) {}

  /** Reads a file into its table; throws a problem for every kind of bad file before anything is stored. */
  async parse(file: UploadedFile, options: CsvOptions & { sheet?: string }): Promise<ParsedTable> {
    const kind = detectKind(file.originalname, file.buffer);
    const raw = kind === 'xlsx'
      ? await readWorkbook(file.buffer, file.originalname, this.limits, options.sheet)
      : readCsv(file.buffer, file.originalname, this.limits, options);
    return buildTable(raw, kind, file.originalname, this.limits);
  }

  /** The earliest upload of the same bytes that this person may know of (their own, or of a run they can see). */
  private async duplicateOf(tx: DbOrTx, person: SessionPerson, sha256: string): Promise<ImportPreview['duplicateOf']> {
    const projectIds = await visibleProjectIds(tx, person);
    const seen: SQL[] = [eq(uploads.uploadedBy, person.id)];
    if (projectIds === null) seen.push(isNotNull(uploads.runId));
    else if (projectIds.length) seen.push(and(isNotNull(uploads.runId), inArray(runs.projectId, projectIds))!);
    const [dup] = await tx.select({ uploadId: uploads.id, runId: uploads.runId, uploadedAt: uploads.createdAt })
      .from(uploads).leftJoin(runs, eq(runs.id, uploads.runId))
      .where(and(eq(uploads.sha256, sha256), or(...seen)))
      .orderBy(asc(uploads.id)).limit(1);
    return dup ? { uploadId: dup.uploadId, runId: dup.runId, uploadedAt: dup.uploadedAt.toISOString() } : undefined;
  }

  private async suggestMap(tx: DbOrTx, headers: readonly string[]) {
    const wanted = JSON.stringify(normalHeaders(headers));
    const maps = await tx.select({ id: columnMaps.id, name: columnMaps.name, headers: columnMaps.headers, mapping: columnMaps.mapping, ownerId: columnMaps.ownerId })
      .from(columnMaps).orderBy(desc(columnMaps.id));
    const match = maps.find((m) => JSON.stringify(normalHeaders(m.headers)) === wanted);
    return match ? { id: match.id, name: match.name, mapping: match.mapping } : undefined;
  }

  /** Upload: parse, then keep the bytes, their SHA-256 and the parsed table in one transaction. */
  async upload(person: SessionPerson, file: UploadedFile, options: CsvOptions & { sheet?: string }, ip: string | null): Promise<ImportPreview> {
    const table = await this.parse(file, options);
    const sha256 = createHash('sha256').update(file.buffer).digest('hex');
    const filename = safeFilename(file.originalname);
    return this.db.transaction(async (tx) => {
      const duplicateOf = await this.duplicateOf(tx, person, sha256);
      const [upload] = await tx.insert(uploads).values({
        sha256, filename, mediaType: file.mimetype || 'application/octet-stream', size: file.buffer.length, content: file.buffer, uploadedBy: person.id,
      }).returning({ id: uploads.id });
      const [imp] = await tx.insert(imports).values({ uploadId: upload.id, createdBy: person.id, parsed: table as unknown as Record<string, unknown> }).returning({ id: imports.id });
      await recordAudit(tx, {
        actorId: person.id, actorEmail: person.email, action: 'import.upload', entityType: 'import', entityId: imp.id,
        after: { uploadId: upload.id, filename, sha256, size: file.buffer.length, rows: table.rowNumbers.length, duplicateOfUpload: duplicateOf?.uploadId ?? null },
        ip,
      });
      const suggestedColumnMap = await this.suggestMap(tx, table.headers);
      return buildPreview(table, {
        importId: imp.id, filename, sha256, ...(duplicateOf ? { duplicateOf } : {}), ...(suggestedColumnMap ? { suggestedColumnMap } : {}),
      });
    });
  }

  /** The preview of an import again (e.g. after a page reload). */
  async preview(person: SessionPerson, id: number): Promise<ImportPreview & { status: string; runId: number | null }> {
    const { imp, sha256, filename } = await loadOwnImport(this.db, person, id);
    const table = imp.parsed as unknown as ParsedTable;
    const [dup] = await this.db.select({ uploadId: uploads.id, runId: uploads.runId, uploadedAt: uploads.createdAt })
      .from(uploads).where(and(eq(uploads.sha256, sha256), eq(uploads.uploadedBy, person.id))).orderBy(asc(uploads.id)).limit(1);
    const duplicateOf = dup && dup.uploadId !== imp.uploadId ? { uploadId: dup.uploadId, runId: dup.runId, uploadedAt: dup.uploadedAt.toISOString() } : undefined;
    const suggestedColumnMap = await this.suggestMap(this.db, table.headers);
    return {
      ...buildPreview(table, { importId: id, filename, sha256, ...(duplicateOf ? { duplicateOf } : {}), ...(suggestedColumnMap ? { suggestedColumnMap } : {}) }),
      status: imp.status,
      runId: imp.runId,
    };
  }

  /** Checks every row against a mapping the person chose; stores nothing. */
  async check(person: SessionPerson, id: number, mapping: ImportMapping) {
    const { imp } = await loadOwnImport(this.db, person, id);
    const table = imp.parsed as unknown as ParsedTable;
    checkMapping(table, mapping);
    const { errors, errorCount, summary } = checkRows(table, mapping);
    return { errors, errorCount, summary };
  }

  commit(person: SessionPerson, id: number, body: CommitBody, ip: string | null) {
    return commitImport(this.db, person, id, body, ip);
  }

  /** Saved column maps: the lab shares them, so a logger mapped once is mapped for everyone. */
  async listColumnMaps(person: SessionPerson) {
    const items = await this.db.select({ id: columnMaps.id, name: columnMaps.name, headers: columnMaps.headers, mapping: columnMaps.mapping, ownerId: columnMaps.ownerId, ownerName: people.name, createdAt: columnMaps.createdAt })
      .from(columnMaps).innerJoin(people, eq(people.id, columnMaps.ownerId)).orderBy(asc(columnMaps.name), asc(columnMaps.id));
    return { items: items.map((m) => ({ ...m, own: m.ownerId === person.id })) };
  }

  async createColumnMap(person: SessionPerson, body: ColumnMapDto, ip: string | null) {
    const mapping = parseMapping(body.mapping);
    // The same checks as at commit, against the headers the map was made from.
    checkMapping({ headers: body.headers } as ParsedTable, mapping);
    return this.db.transaction(async (tx) => {
      const [row] = await tx.insert(columnMaps).values({ name: body.name.trim(), ownerId: person.id, headers: body.headers, mapping: mapping as unknown as Record<string, unknown> }).returning();
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'column-map.create', entityType: 'column-map', entityId: row.id, after: { name: row.name, headers: row.headers, mapping: row.mapping }, ip });
      return { ...row, own: true };
    });
  }
}
