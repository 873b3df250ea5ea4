import { eq, sql } from 'drizzle-orm';
import { auditEvents, projects } from '../../db/schema';
import { approvalMeanings } from '../runs/review-dto';
import { ApiClient, clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { makeThrowawayPerson } from '../../testing/throwaway-people';

import { walkAuditChain } from './audit-service';

// Before every audit write ran in a transaction, twenty parallel failed sign-ins left several events
// on one predecessor (forks) and verify answered valid: false for everyone.

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('the audit chain under parallel writers', () => {
  it('stays one chain after 60 parallel failed sign-ins, refused signatures and ordinary writes', async () => {
    const [gx] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
    const tech = await clientAs(h.app, 'technician');
    const bodies = runBodies(loadFixture('adiabatic'), gx.id);
    const created = await tech.post('/api/runs', bodies.create);
    const put = await tech.put(`/api/runs/${created.body.id}/readings`, { version: created.body.version, ...bodies.readings });
    expect((await tech.post(`/api/runs/${created.body.id}/submit`, { version: put.body.version })).status).toBe(202);
    const version = (await tech.get(`/api/runs/${created.body.id}`)).body.version;
    const signers = await Promise.all([0, 1, 2].map(async (i) => {
      const p = await makeThrowawayPerson(h.handle.db, `fork-signer-${i}`, 'investigator', [gx.id]);
      const c = new ApiClient(h.app);
      expect((await c.signIn(p.email, p.password)).status).toBe(200);
      return c;
    }));
    const known = await makeThrowawayPerson(h.handle.db, 'fork-known');
    const anonymous = new ApiClient(h.app);
    await anonymous.primeCsrf();
    const [{ before }] = await h.handle.db.select({ before: sql<number>`coalesce(max(${auditEvents.id}), 0)::int` }).from(auditEvents);

    const requests = [
      ...Array.from({ length: 25 }, (_, i) => anonymous.post('/api/auth/sign-in', { email: `fork-${i}-${Date.now()}@spec.test`, password: 'guess-guess-guess' })),
      ...Array.from({ length: 10 }, (_, i) => anonymous.post('/api/auth/sign-in', { email: known.email, password: `wrong-${i}` })),
      ...Array.from({ length: 12 }, (_, i) => signers[i % 3].post(`/api/runs/${created.body.id}/approve`, { version, password: `wrong-${i}`, meaning: approvalMeanings[0] })),
      ...Array.from({ length: 12 }, () => tech.get(`/api/runs/${created.body.id}/document`)),
      ...Array.from({ length: 3 }, () => new ApiClient(h.app).signIn(known.email, known.password)),
    ];
    const answers = await Promise.all(requests);
    expect(answers.filter((r) => r.status >= 500)).toEqual([]);

    const forks = await h.handle.db.execute<{ prev: string; n: number }>(sql`
      SELECT prev_hash AS prev, count(*)::int AS n FROM audit_events GROUP BY prev_hash HAVING count(*) > 1`);
    expect([...forks]).toEqual([]);
    const [{ added }] = await h.handle.db.select({ added: sql<number>`count(*)::int` }).from(auditEvents).where(sql`${auditEvents.id} > ${before}`);
    expect(added).toBeGreaterThanOrEqual(60);
    const check = await walkAuditChain(h.handle.db);
    expect(check).toMatchObject({ valid: true, brokenCount: 0, broken: [] });
  }, 240_000);
});
