import { and, asc, eq } from 'drizzle-orm';
import { auditEvents, projectMembers } from '../../db/schema';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { makeThrowawayPerson } from '../../testing/throwaway-people';

// PUT /api/projects/:id/members carries no version: the same list sent again is the same request
// (RFC 9110 §9.2.2: PUT is idempotent). Eight at once (a double click, a client that retries) must
// each answer 200, store the list once and leave one audit event per real change.

let h: ApiHarness;
let admin: ApiClient;
beforeAll(async () => {
  h = await startHarness();
  admin = await clientAs(h.app, 'admin');
});
afterAll(() => h.close());

const uniqueCode = () => `M${Date.now().toString(36).toUpperCase().slice(-6)}${Math.floor(Math.random() * 36 ** 2).toString(36).toUpperCase()}`;

async function project(name: string) {
  return (await admin.post('/api/projects', { code: uniqueCode(), name })).body as { id: number };
}
const stored = async (projectId: number) =>
  (await h.handle.db.select({ id: projectMembers.personId }).from(projectMembers).where(eq(projectMembers.projectId, projectId))).map((r) => r.id).sort((a, b) => a - b);
const memberEvents = (projectId: number) => h.handle.db.select().from(auditEvents)
  .where(and(eq(auditEvents.entityType, 'project'), eq(auditEvents.entityId, String(projectId)), eq(auditEvents.action, 'project.members')))
  .orderBy(asc(auditEvents.id));
const putAtOnce = (projectId: number, bodies: Array<{ personIds: number[] }>) =>
  Promise.all(bodies.map((body) => admin.put(`/api/projects/${projectId}/members`, body)));

describe('PUT /api/projects/:id/members sent 8 times at once', () => {
  it('with the same new list: eight 200s, the list stored once, one audit event from the old list to the new', async () => {
    const p = await project('Parallel members');
    const a = await makeThrowawayPerson(h.handle.db, 'par-a', 'technician', [p.id]);
    const b = await makeThrowawayPerson(h.handle.db, 'par-b', 'technician');
    const c = await makeThrowawayPerson(h.handle.db, 'par-c', 'investigator');
    const answers = await putAtOnce(p.id, Array.from({ length: 8 }, () => ({ personIds: [c.id, b.id] })));
    expect(answers.map((r) => r.status)).toEqual([200, 200, 200, 200, 200, 200, 200, 200]);
    for (const r of answers) expect(r.body).toEqual({ id: p.id, members: [c.id, b.id] });
    expect(await stored(p.id)).toEqual([b.id, c.id].sort((x, y) => x - y));
    const events = await memberEvents(p.id);
    expect(events).toHaveLength(1);
    expect(events[0].before).toEqual({ members: [a.id] });
    expect(events[0].after).toEqual({ members: [b.id, c.id].sort((x, y) => x - y) });
  });

  it('with the list already stored: eight 200s and no audit event, since nothing changed', async () => {
    const p = await project('Parallel unchanged');
    const a = await makeThrowawayPerson(h.handle.db, 'same-a', 'technician', [p.id]);
    const b = await makeThrowawayPerson(h.handle.db, 'same-b', 'investigator', [p.id]);
    const answers = await putAtOnce(p.id, Array.from({ length: 8 }, () => ({ personIds: [b.id, a.id] })));
    expect(answers.map((r) => r.status)).toEqual([200, 200, 200, 200, 200, 200, 200, 200]);
    expect(await stored(p.id)).toEqual([a.id, b.id].sort((x, y) => x - y));
    expect(await memberEvents(p.id)).toHaveLength(0);
  });

  it('with two different lists mixed: every request answered 200, and the trail reads as one change after another', async () => {
    const p = await project('Parallel two lists');
    const a = await makeThrowawayPerson(h.handle.db, 'two-a', 'technician', [p.id]);
    const b = await makeThrowawayPerson(h.handle.db, 'two-b', 'technician');
    const c = await makeThrowawayPerson(h.handle.db, 'two-c', 'investigator');
    const first = { personIds: [a.id, b.id] }, second = { personIds: [c.id] };
    const answers = await putAtOnce(p.id, [first, second, first, second, first, second, first, second]);
    expect(answers.map((r) => r.status)).toEqual([200, 200, 200, 200, 200, 200, 200, 200]);
    // Last writer wins (no version): the stored list is one of the two, and each event starts where the one before ended.
    const final = await stored(p.id);
    expect([[a.id, b.id].sort((x, y) => x - y), [c.id]]).toContainEqual(final);
    const events = await memberEvents(p.id);
    expect(events.length).toBeGreaterThanOrEqual(1);
    expect(events.length).toBeLessThanOrEqual(8);
    let state: unknown = { members: [a.id] };
    for (const e of events) {
      expect(e.before).toEqual(state);
      expect(e.after).not.toEqual(e.before);
      state = e.after;
    }
    expect(state).toEqual({ members: final });
  });
});
