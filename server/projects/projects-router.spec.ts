import { and, asc, eq } from 'drizzle-orm';
import { auditEvents } from '../../db/schema';
import { readableEvents } from '../audit/audit-names';
import { demoEmail } from '../../db/seed/demo-lab';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { makeThrowawayPerson } from '../../testing/throwaway-people';

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

// Codes are at most 12 capitals or digits; a base-36 clock keeps each test's project its own.
const uniqueCode = () => `P${Date.now().toString(36).toUpperCase().slice(-6)}${Math.floor(Math.random() * 36 ** 2).toString(36).toUpperCase()}`;

async function signedIn(email: string, password: string): Promise<ApiClient> {
  const client = await clientAs(h.app, null);
  expect((await client.signIn(email, password)).status).toBe(200);
  return client;
}

/** The project's audit rows, oldest first, read straight from the trail. */
function auditRows(projectId: number) {
  return h.handle.db.select().from(auditEvents)
    .where(and(eq(auditEvents.entityType, 'project'), eq(auditEvents.entityId, String(projectId))))
    .orderBy(asc(auditEvents.id));
}
const auditActions = async (projectId: number) => (await auditRows(projectId)).map((e) => e.action);

describe('GET /api/projects', () => {
  it('shows a member only the projects they belong to, with the members; quality and admin see every project', async () => {
    const admin = await clientAs(h.app, 'admin');
    const created = await admin.post('/api/projects', { code: uniqueCode(), name: 'Membership probe', description: '' });
    expect(created.status).toBe(201);
    const member = await makeThrowawayPerson(h.handle.db, 'proj-member', 'technician', [created.body.id]);
    const outsider = await makeThrowawayPerson(h.handle.db, 'proj-outsider', 'technician');

    const mine = await (await signedIn(member.email, member.password)).get('/api/projects');
    expect(mine.status).toBe(200);
    expect(mine.body.items.map((p: { id: number }) => p.id)).toEqual([created.body.id]);
    expect(mine.body.items[0].members).toEqual([{ id: member.id, name: member.name, role: 'technician' }]);

    const none = await (await signedIn(outsider.email, outsider.password)).get('/api/projects');
    expect(none.body.items).toEqual([]);

    for (const role of ['quality', 'admin'] as const) {
      const all = await (await clientAs(h.app, role)).get('/api/projects');
      expect(all.body.items.map((p: { id: number }) => p.id)).toContain(created.body.id);
    }
  });

  it('answers 401 without a session', async () => {
    expect((await (await clientAs(h.app, null)).get('/api/projects')).status).toBe(401);
  });
});

describe('POST /api/projects', () => {
  it('lets an admin create a project, audited in the same step', async () => {
    const admin = await clientAs(h.app, 'admin');
    const code = uniqueCode();
    const res = await admin.post('/api/projects', { code, name: 'Throttling calorimeter survey', description: 'Spare bench' });
    expect(res.status).toBe(201);
    expect(res.headers['location']).toBe(`/api/projects/${res.body.id}`);
    expect(res.body).toMatchObject({ code, name: 'Throttling calorimeter survey', description: 'Spare bench' });
    expect(await auditActions(res.body.id)).toEqual(['project.create']);
  });

  it('answers 400 naming the field, 409 for a code in use, 403 to anyone but an admin, 401 without a session', async () => {
    const admin = await clientAs(h.app, 'admin');
    const bad = await admin.post('/api/projects', { code: 'gx lower', name: 'Lower-case code' });
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { field: string }) => e.field)).toEqual(['code']);
    const short = await admin.post('/api/projects', { code: uniqueCode(), name: 'ab' });
    expect(short.status).toBe(400);
    expect(short.body.errors[0].field).toBe('name');

    const code = uniqueCode();
    expect((await admin.post('/api/projects', { code, name: 'First of the code' })).status).toBe(201);
    const dup = await admin.post('/api/projects', { code, name: 'Second of the code' });
    expect(dup.status).toBe(409);
    expect(dup.body.detail).toContain(code);

    for (const role of ['technician', 'assistant', 'investigator', 'quality'] as const) {
      expect((await (await clientAs(h.app, role)).post('/api/projects', { code: uniqueCode(), name: 'Not theirs to make' })).status).toBe(403);
    }
    expect((await (await clientAs(h.app, null)).post('/api/projects', { code: uniqueCode(), name: 'No session' })).status).toBe(401);
  });
});

describe('PUT /api/projects/:id/members', () => {
  it('replaces the members and audits before and after in one step', async () => {
    const admin = await clientAs(h.app, 'admin');
    const project = (await admin.post('/api/projects', { code: uniqueCode(), name: 'Members probe' })).body;
    const a = await makeThrowawayPerson(h.handle.db, 'proj-a', 'technician', [project.id]);
    const b = await makeThrowawayPerson(h.handle.db, 'proj-b', 'investigator');
    const res = await admin.put(`/api/projects/${project.id}/members`, { personIds: [b.id, b.id] });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ id: project.id, members: [b.id] });
    const listed = (await admin.get('/api/projects')).body.items.find((p: { id: number }) => p.id === project.id);
    expect(listed.members.map((m: { id: number }) => m.id)).toEqual([b.id]);

    const [, event] = await auditRows(project.id);
    expect(event.action).toBe('project.members');
    expect(event.actorEmail).toBe(demoEmail('admin'));
    expect(event.before).toEqual({ members: [a.id] });
    expect(event.after).toEqual({ members: [b.id] });
    // The trail reads the members by name, not by their ids.
    const [readable] = await readableEvents(h.handle.db, [event]);
    expect(readable.changes).toEqual([{ field: 'Members', before: 'Spec proj-a', after: 'Spec proj-b' }]);
  });

  it('answers 400 for an unknown person and changes nothing, 404 for an unknown project, 403 to a quality officer', async () => {
    const admin = await clientAs(h.app, 'admin');
    const project = (await admin.post('/api/projects', { code: uniqueCode(), name: 'Refusals probe' })).body;
    const a = await makeThrowawayPerson(h.handle.db, 'proj-keep', 'technician', [project.id]);

    const unknown = await admin.put(`/api/projects/${project.id}/members`, { personIds: [a.id, 999_999_999] });
    expect(unknown.status).toBe(400);
    expect(unknown.body.errors[0].field).toBe('personIds');
    expect(unknown.body.detail).toContain('999999999');
    const notNumbers = await admin.put(`/api/projects/${project.id}/members`, { personIds: ['one'] });
    expect(notNumbers.status).toBe(400);
    const kept = (await admin.get('/api/projects')).body.items.find((p: { id: number }) => p.id === project.id);
    expect(kept.members.map((m: { id: number }) => m.id)).toEqual([a.id]);
    expect(await auditActions(project.id)).toEqual(['project.create']);

    expect((await admin.put('/api/projects/999999999/members', { personIds: [] })).status).toBe(404);
    expect((await admin.put('/api/projects/abc/members', { personIds: [] })).status).toBe(404);
    expect((await (await clientAs(h.app, 'quality')).put(`/api/projects/${project.id}/members`, { personIds: [] })).status).toBe(403);
    expect((await (await clientAs(h.app, null)).put(`/api/projects/${project.id}/members`, { personIds: [] })).status).toBe(401);
  });
});
