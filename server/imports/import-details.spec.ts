import { and, desc, eq, sql } from 'drizzle-orm';
import { apparatus, auditEvents, gases, projects, uploads } from '../../db/schema';
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

describe('a new draft from an import carries what the file does not', () => {
  const file = () => csv(['Time (s),P (kPa),T/°C', '0,101.3,25.1', '10,102.0,25.4', '20,102.8,25.9']);
  const mapping = (m: { columns: { channel: string }[] }) => ({ ...m, columns: m.columns.map((c) => (c.channel === 'pressure' ? { ...c, reference: 'gauge' } : c)) });

  it('takes the gas, apparatus, run date, amount of gas and ambient conditions, and opens a draft whose checklist no longer asks for them', async () => {
    const [n2] = await h.handle.db.select({ id: gases.id }).from(gases).where(eq(gases.code, 'N2'));
    const [pc3] = await h.handle.db.select({ id: apparatus.id }).from(apparatus).where(eq(apparatus.tag, 'PC-3'));
    const up = await uploadFile(tech, 'bench-logger.csv', file());
    const setup = {
      gas: { model: 'species', species: 'N2' },
      amount: { from: 'moles', value: 0.04, u: 0.0004 },
      ambient: { pressure: { value: 1012.5, unit: 'hPa', u: 0.3 }, temperature: { value: 21.4, unit: 'degC', u: 0.2 } },
    };
    const commit = await tech.post(`/api/imports/${up.body.importId}/commit`, {
      mapping: mapping(up.body.mapping),
      target: { newRun: { projectId, title: 'Imported with its setup', process: 'isochoric', runDate: '2026-02-27', gasId: n2.id, apparatusId: pc3.id, setup } },
    });
    expect(commit.status).toBe(201);
    const run = (await tech.get(`/api/runs/${commit.body.runId}`)).body;
    expect(run).toMatchObject({ runDate: '2026-02-27', gasId: n2.id, apparatusId: pc3.id });
    expect(run.setup).toMatchObject({ ...setup, time: { unit: 's' } });
    expect(run.setup.channels.pressure).toMatchObject({ unit: 'kPa', reference: 'gauge' });
    // The gauge readings have their barometer, the gas its amount: the checklist does not ask for them.
    const checklist = (await tech.get(`/api/runs/${commit.body.runId}/checklist`)).body;
    const fields = JSON.stringify(checklist);
    expect(fields).not.toMatch(/"field":"(gas|amount|ambient[^"]*)"/);
  });

  it('refuses setup keys the file itself gives (time, channels) and a bad ambient unit, naming the field, and stores nothing', async () => {
    const up = await uploadFile(tech, 'bench-logger-2.csv', file());
    const target = (setup: unknown) => ({ newRun: { projectId, title: 'Refused setup', process: 'isochoric', runDate: '2026-02-27', setup } });
    const channels = await tech.post(`/api/imports/${up.body.importId}/commit`, { mapping: mapping(up.body.mapping), target: target({ channels: {} }) });
    expect(channels.status).toBe(400);
    expect(channels.body.errors).toEqual([{ field: 'target.newRun.setup.channels', message: 'not taken on import' }]);
    const unit = await tech.post(`/api/imports/${up.body.importId}/commit`, { mapping: mapping(up.body.mapping), target: target({ ambient: { pressure: { value: 1, unit: 'furlong' } } }) });
    expect(unit.status).toBe(400);
    expect(unit.body.errors[0].field).toBe('target.newRun.setup.ambient.pressure.unit');
    const [stored] = await h.handle.db.select({ runId: uploads.runId }).from(uploads).orderBy(desc(uploads.id)).limit(1);
    expect(stored.runId).toBeNull();
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
