import bcrypt from 'bcryptjs';
import { and, eq, inArray } from 'drizzle-orm';
import { auditEvents, people, projects } from '../../db/schema';
import { demoEmail } from '../../db/seed/demo-lab';
import { approvalMeanings } from '../runs/review-dto';
import { ApiClient, clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { makeThrowawayPerson } from '../../testing/throwaway-people';
import { signInFailedText } from './auth-service';
import { BCRYPT_COST, dummyPasswordHash } from './password-attempts';

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

const eventsFor = async (email: string) =>
  h.handle.db.select().from(auditEvents).where(eq(auditEvents.actorEmail, email)).orderBy(auditEvents.id);

const unknownEmail = () => `nobody-${Date.now()}-${Math.random().toString(36).slice(2, 8)}@spec.test`;

describe('the sign-in limit', () => {
  it('ignores a client-chosen X-Forwarded-For: every guess counts against the real address, which is what the trail stores', async () => {
    const limited = await startHarness({ signInRateLimit: 3 });
    try {
      const client = new ApiClient(limited.app);
      await client.primeCsrf();
      const email = unknownEmail();
      const statuses: number[] = [];
      for (const forwarded of ['=4+5', '198.51.100.1', '198.51.100.2', '198.51.100.3']) {
        statuses.push((await client.post('/api/auth/sign-in', { email, password: 'guess-guess-guess' }).set('X-Forwarded-For', forwarded)).status);
      }
      expect(statuses).toEqual([401, 401, 401, 429]);
      const ips = (await eventsFor(email)).map((e) => e.ip);
      expect(ips).toHaveLength(3);
      for (const ip of ips) expect(ip).toMatch(/^(::ffff:)?127\.0\.0\.1$|^::1$/);
    } finally {
      await limited.close();
    }
  });

  it('with a proxy named (QWELL_TRUST_PROXY), stores the forwarded address only when it is an address, and counts failures per account across addresses', async () => {
    const proxied = await startHarness({ signInRateLimit: 3, trustProxy: 'loopback' });
    try {
      const client = new ApiClient(proxied.app);
      await client.primeCsrf();
      const email = unknownEmail();
      const answers: { status: number; detail: string }[] = [];
      for (const forwarded of ['=4+5', '203.0.113.7', '203.0.113.8', '203.0.113.9']) {
        const res = await client.post('/api/auth/sign-in', { email, password: 'guess-guess-guess' }).set('X-Forwarded-For', forwarded);
        answers.push({ status: res.status, detail: res.body.detail });
      }
      expect(answers.map((a) => a.status)).toEqual([401, 401, 401, 429]);
      expect(answers[3].detail).toMatch(/for this account/);
      expect((await eventsFor(email)).map((e) => e.ip)).toEqual([null, '203.0.113.7', '203.0.113.8']);
    } finally {
      await proxied.close();
    }
  });

  it('does not count successful sign-ins, and states the limiter\'s real wait', async () => {
    const limited = await startHarness({ signInRateLimit: 3, signInRateWindowMs: 41_000 });
    try {
      const person = await makeThrowawayPerson(limited.handle.db, 'class');
      const client = new ApiClient(limited.app);
      await client.primeCsrf();
      // A class behind one address signing in one after another.
      for (let i = 0; i < 6; i++) expect((await client.signIn(person.email, person.password)).status).toBe(200);
      for (let i = 0; i < 3; i++) expect((await client.signIn(unknownEmail(), 'guess-guess-guess')).status).toBe(401);
      const refused = await client.signIn(person.email, person.password);
      expect(refused.status).toBe(429);
      expect(refused.body.detail).toMatch(/Try again after \d\d:\d\d UTC \(in (3\d|4[01]) seconds\)/);
      expect(refused.body.detail).not.toMatch(/15 minutes/);
    } finally {
      await limited.close();
    }
  });
});

describe('one answer for unknown, inactive and wrong-password sign-ins', () => {
  it('answers all three with the same status and words', async () => {
    const inactive = await makeThrowawayPerson(h.handle.db, 'inactive');
    await h.handle.db.update(people).set({ active: false }).where(eq(people.id, inactive.id));
    const known = await makeThrowawayPerson(h.handle.db, 'known');
    const client = new ApiClient(h.app);
    const answers = [
      await client.signIn(unknownEmail(), 'guess-guess-guess'),
      await client.signIn(inactive.email, inactive.password),
      await client.signIn(known.email, 'guess-guess-guess'),
    ].map((r) => ({ status: r.status, detail: r.body.detail }));
    expect(answers).toEqual(Array(3).fill({ status: 401, detail: signInFailedText(h.config) }));
  });

  it('compares an unknown address against a hash of the same bcrypt cost as real ones', async () => {
    const [demo] = await h.handle.db.select({ hash: people.passwordHash }).from(people).where(eq(people.email, demoEmail('technician')));
    expect(bcrypt.getRounds(dummyPasswordHash())).toBe(BCRYPT_COST);
    expect(bcrypt.getRounds(demo.hash)).toBe(BCRYPT_COST);
  });
});

describe('the lockout under parallel guesses', () => {
  it('compares at most the limit of passwords, and the right one does not get in once the account locks', async () => {
    const person = await makeThrowawayPerson(h.handle.db, 'race');
    const client = new ApiClient(h.app);
    await client.primeCsrf();
    const guesses = Array.from({ length: 30 }, (_, i) => client.post('/api/auth/sign-in', { email: person.email, password: `wrong-guess-${i}` }));
    const answers = await Promise.all([...guesses, client.post('/api/auth/sign-in', { email: person.email, password: person.password })]);
    const statuses = answers.map((r) => r.status);
    const [row] = await h.handle.db.select().from(people).where(eq(people.id, person.id));
    expect(row.lockedUntil!.getTime()).toBeGreaterThan(Date.now() + 14 * 60_000);
    expect(statuses.filter((s) => s === 200)).toHaveLength(0);
    const events = await eventsFor(person.email);
    // Every compared password leaves one event: a wrong one, a sign-in, or a right one refused because the lock won.
    const compared = events.filter((e) => (e.action === 'auth.sign-in-failed' && e.reason === 'wrong password') || e.action === 'auth.sign-in'
      || (e.action === 'auth.sign-in-refused' && e.reason === 'account locked while the password was checked'));
    expect(compared.length).toBeLessThanOrEqual(h.config.lockoutAttempts);
    expect(statuses.filter((s) => s === 423).length).toBeGreaterThanOrEqual(31 - h.config.lockoutAttempts);
    expect(events.filter((e) => e.action === 'auth.account-locked').length).toBeGreaterThanOrEqual(1);
  });
});

describe('signature passwords', () => {
  it('answers 404 for a run that does not exist whatever the password, without counting it', async () => {
    const signer = await clientAs(h.app, 'investigator');
    const body = (password: string) => ({ version: 1, password, meaning: approvalMeanings[0] });
    expect((await signer.post('/api/runs/999999/approve', body('not-my-password'))).status).toBe(404);
    expect((await signer.post('/api/runs/999999/approve', body('qwell-demo-lab'))).status).toBe(404);
    const [row] = await h.handle.db.select({ n: people.failedAttempts }).from(people).where(eq(people.email, demoEmail('investigator')));
    expect(row.n).toBe(0);
  });

  it('count toward the sign-in lockout: the fifth wrong one locks the account, and sign-in is refused too', async () => {
    const [gx] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
    const tech = await clientAs(h.app, 'technician');
    const bodies = runBodies(loadFixture('adiabatic'), gx.id);
    const created = await tech.post('/api/runs', bodies.create);
    const put = await tech.put(`/api/runs/${created.body.id}/readings`, { version: created.body.version, ...bodies.readings });
    expect((await tech.post(`/api/runs/${created.body.id}/submit`, { version: put.body.version })).status).toBe(202);
    const version = (await tech.get(`/api/runs/${created.body.id}`)).body.version;

    const reviewer = await makeThrowawayPerson(h.handle.db, 'signer', 'investigator', [gx.id]);
    const client = new ApiClient(h.app);
    expect((await client.signIn(reviewer.email, reviewer.password)).status).toBe(200);
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) {
      statuses.push((await client.post(`/api/runs/${created.body.id}/approve`, { version, password: `wrong-${i}`, meaning: approvalMeanings[0] })).status);
    }
    expect(statuses).toEqual([401, 401, 401, 401, 423, 423]);
    const fresh = new ApiClient(h.app);
    expect((await fresh.signIn(reviewer.email, reviewer.password)).status).toBe(423);
    const refused = await h.handle.db.select().from(auditEvents)
      .where(and(eq(auditEvents.actorEmail, reviewer.email), inArray(auditEvents.action, ['signature.refused', 'auth.account-locked'])));
    expect(refused.filter((e) => e.action === 'signature.refused')).toHaveLength(6);
    expect(refused.filter((e) => e.action === 'auth.account-locked')).toHaveLength(1);
  });
});
