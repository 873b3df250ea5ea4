import { and, asc, eq, inArray } from 'drizzle-orm';
import { auditEvents, people } from '../../db/schema';
import { demoEmail } from '../../db/seed/demo-lab';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { makeThrowawayPerson } from '../../testing/throwaway-people';

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

// One signed-in client per demo role for the file: each sign-in costs a full-cost bcrypt compare.
const clients = new Map<string, Promise<ApiClient>>();
const as = (role: 'technician' | 'assistant' | 'investigator' | 'quality' | 'admin') => {
  if (!clients.has(role)) clients.set(role, clientAs(h.app, role));
  return clients.get(role)!;
};

const uniqueEmail = (tag: string) => `${tag}-${Date.now()}-${Math.random().toString(36).slice(2, 7)}@people-spec.test`;
const NEW_PASSWORD = 'a-long-enough-password';

/** The account changes recorded for a person (their own sign-ins are recorded against them too). */
function auditRows(personId: number) {
  return h.handle.db.select().from(auditEvents)
    .where(and(eq(auditEvents.entityType, 'person'), eq(auditEvents.entityId, String(personId)), inArray(auditEvents.action, ['person.create', 'person.update'])))
    .orderBy(asc(auditEvents.id));
}

async function signedIn(email: string, password: string): Promise<ApiClient> {
  const client = await clientAs(h.app, null);
  expect((await client.signIn(email, password)).status).toBe(200);
  return client;
}

describe('GET /api/people', () => {
  it('lists every account by name for an administrator, without password hashes', async () => {
    const made = await makeThrowawayPerson(h.handle.db, 'people-list', 'assistant');
    const res = await (await as('admin')).get('/api/people');
    expect(res.status).toBe(200);
    const row = res.body.items.find((p: { id: number }) => p.id === made.id);
    expect(row).toMatchObject({ email: made.email, name: made.name, role: 'assistant', active: true, lockedUntil: null });
    expect(Object.keys(row).sort()).toEqual(['active', 'createdAt', 'email', 'id', 'lockedUntil', 'name', 'role']);
    const names: string[] = res.body.items.map((p: { name: string }) => p.name);
    expect(names).toEqual([...names].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0)));
  });

  it('answers 403 to every other role and 401 without a session', async () => {
    for (const role of ['technician', 'assistant', 'investigator', 'quality'] as const) {
      expect((await (await as(role)).get('/api/people')).status).toBe(403);
    }
    expect((await (await clientAs(h.app, null)).get('/api/people')).status).toBe(401);
  });
});

describe('POST /api/people', () => {
  it('creates an account that can sign in, its e-mail in lower case; the audit row holds no password', async () => {
    const admin = await as('admin');
    const email = uniqueEmail('New.Person');
    const res = await admin.post('/api/people', { email, name: '  Tove Lindqvist ', role: 'technician', password: NEW_PASSWORD });
    expect(res.status).toBe(201);
    expect(res.headers['location']).toBe(`/api/people/${res.body.id}`);
    expect(res.body).toMatchObject({ email: email.toLowerCase(), name: 'Tove Lindqvist', role: 'technician', active: true });
    expect(res.body).not.toHaveProperty('passwordHash');
    await signedIn(email.toLowerCase(), NEW_PASSWORD);

    const [event] = await auditRows(res.body.id);
    expect(event).toMatchObject({ action: 'person.create', actorEmail: demoEmail('admin') });
    expect(JSON.stringify(event.after)).not.toContain(NEW_PASSWORD);
    expect(event.after).not.toHaveProperty('passwordHash');
  });

  it('answers 400 naming the field, 409 for an address in use (whatever its case), 403 to a quality officer', async () => {
    const admin = await as('admin');
    const fieldOf = async (body: object) => {
      const res = await admin.post('/api/people', body);
      expect(res.status).toBe(400);
      return res.body.errors.map((e: { field: string }) => e.field);
    };
    expect(await fieldOf({ email: 'not-an-address', name: 'Some One', role: 'technician', password: NEW_PASSWORD })).toEqual(['email']);
    expect(await fieldOf({ email: uniqueEmail('short'), name: 'Some One', role: 'technician', password: 'eleven-char' })).toEqual(['password']);
    expect(await fieldOf({ email: uniqueEmail('role'), name: 'Some One', role: 'director', password: NEW_PASSWORD })).toEqual(['role']);

    const existing = await makeThrowawayPerson(h.handle.db, 'people-dup');
    const dup = await admin.post('/api/people', { email: existing.email.toUpperCase(), name: 'Twice Over', role: 'technician', password: NEW_PASSWORD });
    expect(dup.status).toBe(409);
    expect(dup.body.detail).toContain(existing.email);

    const quality = await as('quality');
    expect((await quality.post('/api/people', { email: uniqueEmail('q'), name: 'Not Theirs', role: 'technician', password: NEW_PASSWORD })).status).toBe(403);
    expect((await (await clientAs(h.app, null)).post('/api/people', {})).status).toBe(401);
  });
});

describe('PATCH /api/people/:id', () => {
  it('renames and changes the role, with before and after in the audit row', async () => {
    const person = await makeThrowawayPerson(h.handle.db, 'people-edit', 'technician');
    const res = await (await as('admin')).patch(`/api/people/${person.id}`, { name: 'Jonas Aalto', role: 'assistant' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: person.id, name: 'Jonas Aalto', role: 'assistant' });
    const [event] = await auditRows(person.id);
    expect(event.action).toBe('person.update');
    expect(event.before).toMatchObject({ name: person.name, role: 'technician' });
    expect(event.after).toMatchObject({ name: 'Jonas Aalto', role: 'assistant' });
  });

  it('a new password ends the person\'s open sessions and is recorded only as changed', async () => {
    const person = await makeThrowawayPerson(h.handle.db, 'people-pw');
    const theirs = await signedIn(person.email, person.password);
    expect((await theirs.get('/api/auth/me')).status).toBe(200);
    const res = await (await as('admin')).patch(`/api/people/${person.id}`, { password: NEW_PASSWORD });
    expect(res.status).toBe(200);
    expect((await theirs.get('/api/projects')).status).toBe(401);
    await signedIn(person.email, NEW_PASSWORD);
    const [event] = await auditRows(person.id);
    expect(event.after).toMatchObject({ passwordChanged: true });
    expect(JSON.stringify(event)).not.toContain(NEW_PASSWORD);
  });

  it('deactivating an account ends its sessions and keeps it from signing in', async () => {
    const person = await makeThrowawayPerson(h.handle.db, 'people-off');
    const theirs = await signedIn(person.email, person.password);
    expect((await (await as('admin')).patch(`/api/people/${person.id}`, { active: false })).body.active).toBe(false);
    expect((await theirs.get('/api/projects')).status).toBe(401);
    expect((await (await clientAs(h.app, null)).signIn(person.email, person.password)).status).toBe(401);
  });

  it('answers 400 to an administrator removing their own access, and to a bad field, changing nothing', async () => {
    const admin = await as('admin');
    const me = (await admin.get('/api/auth/me')).body.person;
    const own = await admin.patch(`/api/people/${me.id}`, { role: 'quality' });
    expect(own.status).toBe(400);
    expect(own.body.detail).toContain('your own administrator access');
    expect((await admin.patch(`/api/people/${me.id}`, { active: false })).status).toBe(400);
    const [still] = await h.handle.db.select({ role: people.role, active: people.active }).from(people).where(eq(people.id, me.id));
    expect(still).toEqual({ role: 'admin', active: true });

    const person = await makeThrowawayPerson(h.handle.db, 'people-bad');
    const bad = await admin.patch(`/api/people/${person.id}`, { active: 'yes' });
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].field).toBe('active');
    expect(await auditRows(person.id)).toEqual([]);
  });

  it('answers 404 for an unknown person, 403 to anyone but an administrator, 401 without a session', async () => {
    const admin = await as('admin');
    expect((await admin.patch('/api/people/999999999', { name: 'Nobody Here' })).status).toBe(404);
    expect((await admin.patch('/api/people/abc', { name: 'Nobody Here' })).status).toBe(404);
    const person = await makeThrowawayPerson(h.handle.db, 'people-403');
    expect((await (await as('quality')).patch(`/api/people/${person.id}`, { role: 'admin' })).status).toBe(403);
    expect((await (await clientAs(h.app, null)).patch(`/api/people/${person.id}`, { role: 'admin' })).status).toBe(401);
  });
});
