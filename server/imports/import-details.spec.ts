import { and, desc, eq, sql } from 'drizzle-orm';
import { auditEvents, projects, uploads } from '../../db/schema';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { csv, uploadFile } from '../../testing/import-spec-support';

let h: ApiHarness;
let tech: ApiClient;
let projectId: number;
beforeAll(async () => {
  h = await startHarness();
  tech = await clientAs(h.app, 'technician');
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
});
afterAll(() => h.close());

describe('file names and time units as loggers write them', () => {
  it('a UTF-8 file name is stored and audited as sent, not as latin1 mojibake', async () => {
    const name = 'Messung_März_°C.csv';
    const res = await uploadFile(tech, name, csv(['Time (s),P (kPa),T/°C', '0,101.3,25.1', '10,102.0,25.4']));
    expect(res.status).toBe(201);
    expect(res.body.filename).toBe(name);
    const [upload] = await h.handle.db.select({ filename: uploads.filename }).from(uploads).orderBy(desc(uploads.id)).limit(1);
    expect(upload.filename).toBe(name);
    const [event] = await h.handle.db.select({ after: auditEvents.after }).from(auditEvents)
      .where(and(eq(auditEvents.action, 'import.upload'))).orderBy(desc(auditEvents.id)).limit(1);
    expect((event.after as { filename: string }).filename).toBe(name);
  });

  it('a time column in ms is guessed as ms and stored in seconds', async () => {
    const res = await uploadFile(tech, 'fast-logger.csv', csv(['Time (ms),P (kPa),T/°C', '0,101.3,25.1', '250,102.0,25.4', '500,102.8,25.9']));
    expect(res.status).toBe(201);
    expect(res.body.columns[0].guess).toEqual({ channel: 'time', unit: 'ms' });
    expect(res.body.summary.timeSpan).toMatchObject({ from: 0, to: 500, unit: 'ms', seconds: 0.5 });
    const commit = await tech.post(`/api/imports/${res.body.importId}/commit`, {
      mapping: { ...res.body.mapping, columns: res.body.mapping.columns.map((c: { channel: string }) => (c.channel === 'pressure' ? { ...c, reference: 'absolute' } : c)) },
      target: { newRun: { projectId, title: 'Fast logger in milliseconds', process: 'isochoric', runDate: '2026-03-14' } },
    });
    expect(commit.status).toBe(201);
    const run = (await tech.get(`/api/runs/${commit.body.runId}`)).body;
    expect(run.readings.time).toEqual([0, 0.25, 0.5]);
    expect(run.setup.time).toEqual({ unit: 's' });
  });
});

describe('uploads retention', () => {
  it('deletes uploads never committed once past the retention period, keeps committed and recent ones, and audits it', async () => {
    const { purgeStaleUploads } = await import('./upload-retention');
    const { imports } = await import('../../db/schema');
    const left = await uploadFile(tech, 'left-behind.csv', csv(['Time (s),P (kPa),T/°C', '0,101.3,25.1', '10,102.0,25.4', '20,102.1,25.5']));
    expect(left.status).toBe(201);
    const [leftUpload] = await h.handle.db.select({ id: imports.uploadId }).from(imports).where(eq(imports.id, left.body.importId));
    const committed = await h.handle.db.select({ id: uploads.id }).from(uploads).where(sql`${uploads.runId} IS NOT NULL`);
    expect(committed.length).toBeGreaterThan(0);
    // Forty days on, with 30 days' retention: this upload is stale; uploads committed into runs are not.
    const later = new Date(Date.now() + 40 * 24 * 3600 * 1000);
    const purged = await purgeStaleUploads(h.handle.db, 30, later);
    expect(purged).toBeGreaterThanOrEqual(1);
    expect(await h.handle.db.select().from(uploads).where(eq(uploads.id, leftUpload.id))).toEqual([]);
    expect(await h.handle.db.select().from(imports).where(eq(imports.id, left.body.importId))).toEqual([]);
    const stillThere = await h.handle.db.select({ id: uploads.id }).from(uploads).where(sql`${uploads.runId} IS NOT NULL`);
    expect(stillThere.map((u) => u.id).sort()).toEqual(committed.map((u) => u.id).sort());
    const [event] = await h.handle.db.select().from(auditEvents).where(eq(auditEvents.action, 'upload.purge')).orderBy(desc(auditEvents.id)).limit(1);
    expect(event.after).toMatchObject({ uploads: purged, retentionDays: 30 });
    // Today, nothing is past 30 days: a second run deletes nothing.
    expect(await purgeStaleUploads(h.handle.db, 30)).toBe(0);
  });
});
