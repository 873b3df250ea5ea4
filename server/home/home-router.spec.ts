import { eq } from 'drizzle-orm';
import { projects } from '../../db/schema';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { makeThrowawayPerson } from '../../testing/throwaway-people';

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

type Queue = { key: string; label: string; count: number; link: string; queryParams?: Record<string, string> };

async function signedIn(email: string, password: string): Promise<ApiClient> {
  const client = await clientAs(h.app, null);
  expect((await client.signIn(email, password)).status).toBe(200);
  return client;
}

describe('GET /api/home', () => {
  it('gives each role its own queue', async () => {
    const keys = async (role: 'technician' | 'investigator' | 'quality' | 'admin') =>
      (await (await clientAs(h.app, role)).get('/api/home')).body.queues.map((q: { key: string }) => q.key);
    expect(await keys('technician')).toEqual(['my-drafts', 'returned-to-me', 'waiting-for-review']);
    expect(await keys('investigator')).toEqual(['runs-to-review', 'breaking-balances', 'over-pressure']);
    expect(await keys('quality')).toEqual(['calibrations-due', 'out-of-calibration', 'never-calibrated', 'runs-waiting', 'over-pressure']);
    expect(await keys('admin')).toEqual(['people', 'locked-accounts']);
    const review = (await (await clientAs(h.app, 'investigator')).get('/api/home')).body.queues[0];
    expect(review.count).toBeGreaterThanOrEqual(3);
  });

  it('counts an author\'s own drafts and links to exactly that list', async () => {
    const [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
    const person = await makeThrowawayPerson(h.handle.db, 'home-author', 'technician', [projectId]);
    const author = await signedIn(person.email, person.password);
    const drafts = async () => {
      const res = await author.get('/api/home');
      expect(res.status).toBe(200);
      expect(res.body.role).toBe('technician');
      return (res.body.queues as Queue[]).find((q) => q.key === 'my-drafts')!;
    };
    expect((await drafts()).count).toBe(0);

    const created = await author.post('/api/runs', runBodies(loadFixture('isobaric'), projectId).create);
    expect(created.status).toBe(201);
    expect(await drafts()).toEqual({ key: 'my-drafts', label: 'My drafts', count: 1, link: '/runs', queryParams: { state: 'draft', mine: 'true' } });
    // Another author's draft in the same project is not theirs to count.
    const other = await clientAs(h.app, 'technician');
    expect((await other.post('/api/runs', runBodies(loadFixture('isobaric'), projectId).create)).status).toBe(201);
    expect((await drafts()).count).toBe(1);
  });

  it('answers 401 without a session', async () => {
    const res = await (await clientAs(h.app, null)).get('/api/home');
    expect(res.status).toBe(401);
    expect(res.headers['content-type']).toContain('application/problem+json');
  });
});
