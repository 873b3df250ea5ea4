import bcrypt from 'bcryptjs';
import { asc, eq } from 'drizzle-orm';
import { SignJWT, UnsecuredJWT } from 'jose';
import request from 'supertest';
import { auditEvents, people, roles } from '../../db/schema';
import { demoEmail } from '../../db/seed/demo-lab';
import { ApiClient, clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';
import { SESSION_COOKIE } from '../core/session';
import { signInFailedText } from './auth-service';

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

async function makePerson(tag: string, password = 'a-long-enough-password') {
  const email = `${tag}-${Date.now()}-${Math.random().toString(36).slice(2, 8)}@auth-spec.test`;
  const [row] = await h.handle.db
    .insert(people)
    .values({ email, name: `Spec ${tag}`, role: 'technician', passwordHash: await bcrypt.hash(password, 10) })
    .returning();
  return { ...row, password };
}

const actionsFor = async (email: string) =>
  // In the trail's order: without ORDER BY, PostgreSQL may return rows in any order (once seen: sign-out before sign-in).
  (await h.handle.db.select().from(auditEvents).where(eq(auditEvents.actorEmail, email)).orderBy(asc(auditEvents.id))).map((e) => e.action);

describe('GET /api/auth/me', () => {
  it('answers 401 as a problem without a session', async () => {
    const res = await request(h.app).get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body).toMatchObject({ status: 401, title: 'Not signed in' });
    expect(res.body.stack).toBeUndefined();
  });

  it('refuses a token signed with "alg: none"', async () => {
    const token = new UnsecuredJWT({ role: 'admin' }).setSubject('1').setIssuer('qwell').setExpirationTime('1h').encode();
    const res = await request(h.app).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=${token}`);
    expect(res.status).toBe(401);
  });

  it('refuses a token signed with another key and an expired one', async () => {
    const foreign = await new SignJWT({ role: 'admin' }).setProtectedHeader({ alg: 'HS256' }).setSubject('1').setIssuer('qwell')
      .setExpirationTime('1h').sign(new TextEncoder().encode('x'.repeat(48)));
    const expired = await new SignJWT({ role: 'admin' }).setProtectedHeader({ alg: 'HS256' }).setSubject('1').setIssuer('qwell')
      .setIssuedAt(Math.floor(Date.now() / 1000) - 9 * 3600).setExpirationTime(Math.floor(Date.now() / 1000) - 3600).sign(h.config.sessionSecret);
    for (const token of [foreign, expired]) {
      const res = await request(h.app).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=${token}`);
      expect(res.status).toBe(401);
    }
  });
});

describe('POST /api/auth/sign-in', () => {
  it.each(roles)('signs in the demo %s and reports the role', async (role) => {
    const client = new ApiClient(h.app);
    const res = await client.signIn(demoEmail(role));
    expect(res.status).toBe(200);
    expect(res.body.person).toMatchObject({ email: demoEmail(role), role });
    const cookie = ([] as string[]).concat(res.headers['set-cookie']).find((c) => c.startsWith(`${SESSION_COOKIE}=`))!;
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Strict/);
    expect(cookie).toMatch(/Max-Age=28800/); // 8 hours
    const me = await client.get('/api/auth/me');
    expect(me.body.person.role).toBe(role);
  });

  it('accepts the address in any case and with spaces around it', async () => {
    const client = new ApiClient(h.app);
    const res = await client.signIn(`  ${demoEmail('quality').toUpperCase()} `);
    expect(res.status).toBe(200);
    expect(res.body.person.role).toBe('quality');
  });

  it('answers 400 naming the missing field', async () => {
    const client = new ApiClient(h.app);
    await client.primeCsrf();
    const res = await client.post('/api/auth/sign-in', { email: 'someone@x.test' });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual(expect.arrayContaining([expect.objectContaining({ field: 'password' })]));
  });

  it('refuses a sign-in without the CSRF header (403) and writes nothing', async () => {
    const person = await makePerson('csrf');
    const client = new ApiClient(h.app);
    await client.primeCsrf();
    const res = await client.agent.post('/api/auth/sign-in').send({ email: person.email, password: person.password });
    expect(res.status).toBe(403);
    expect(res.body.detail).toMatch(/CSRF/);
    expect(await actionsFor(person.email)).toEqual([]);
  });

  it('answers four wrong passwords like an unknown address, locks on the fifth with the real wait, and refuses the sixth with 423', async () => {
    const person = await makePerson('lock');
    const client = new ApiClient(h.app);
    const details: string[] = [];
    for (let i = 0; i < 4; i++) {
      const res = await client.signIn(person.email, 'wrong-password');
      expect(res.status).toBe(401);
      details.push(res.body.detail);
    }
    // No "attempts left": that sentence told a known address from an unknown one.
    expect(new Set(details)).toEqual(new Set([signInFailedText(h.config)]));
    const fifth = await client.signIn(person.email, 'wrong-password');
    expect(fifth.status).toBe(423);
    expect(fifth.body.detail).toMatch(/Try again after \d\d:\d\d UTC \(in 15 minutes\)/);
    // The right password does not help while the lock holds.
    const sixth = await client.signIn(person.email, person.password);
    expect(sixth.status).toBe(423);
    expect(sixth.body.detail).toMatch(/locked/);
    const [row] = await h.handle.db.select().from(people).where(eq(people.id, person.id));
    const minutes = (row.lockedUntil!.getTime() - Date.now()) / 60000;
    expect(minutes).toBeGreaterThan(14);
    expect(minutes).toBeLessThanOrEqual(15);
    const actions = await actionsFor(person.email);
    expect(actions.filter((a) => a === 'auth.sign-in-failed')).toHaveLength(5);
    expect(actions).toContain('auth.account-locked');
    expect(actions).toContain('auth.sign-in-refused');
  });

  it('resets the failure count after a successful sign-in', async () => {
    const person = await makePerson('reset');
    const client = new ApiClient(h.app);
    await client.signIn(person.email, 'wrong-password');
    await client.signIn(person.email, 'wrong-password');
    const count = async () => (await h.handle.db.select({ n: people.failedAttempts }).from(people).where(eq(people.id, person.id)))[0].n;
    expect(await count()).toBe(2);
    expect((await client.signIn(person.email, person.password)).status).toBe(200);
    expect(await count()).toBe(0);
    expect((await client.signIn(person.email, 'wrong-password')).status).toBe(401);
    expect(await count()).toBe(1);
  });

  it('gives an unknown address the same answer as a wrong password, and records it', async () => {
    const client = new ApiClient(h.app);
    const email = `nobody-${Date.now()}@auth-spec.test`;
    const res = await client.signIn(email, 'whatever-password');
    expect(res.status).toBe(401);
    expect(res.body.detail).toBe(signInFailedText(h.config));
    expect(await actionsFor(email)).toEqual(['auth.sign-in-failed']);
  });

  it('rate-limits sign-in attempts per client address (429)', async () => {
    const limited = await startHarness({ signInRateLimit: 3 });
    try {
      const client = new ApiClient(limited.app);
      const codes: number[] = [];
      for (let i = 0; i < 4; i++) codes.push((await client.signIn(`rate-${i}@auth-spec.test`, 'x-password')).status);
      expect(codes).toEqual([401, 401, 401, 429]);
    } finally {
      await limited.close();
    }
  });
});

describe('POST /api/auth/sign-out', () => {
  it('clears the session and records the event', async () => {
    const person = await makePerson('out');
    const client = new ApiClient(h.app);
    expect((await client.signIn(person.email, person.password)).status).toBe(200);
    const res = await client.post('/api/auth/sign-out');
    expect(res.status).toBe(204);
    expect((await client.get('/api/auth/me')).status).toBe(401);
    expect(await actionsFor(person.email)).toEqual(['auth.sign-in', 'auth.sign-out']);
  });

  it('answers 401 without a session', async () => {
    const client = await clientAs(h.app, null);
    expect((await client.post('/api/auth/sign-out')).status).toBe(401);
  });

  it('revokes the token itself: a copy of the cookie kept from before sign-out no longer works', async () => {
    const person = await makePerson('revoke');
    const client = new ApiClient(h.app);
    const res = await client.signIn(person.email, person.password);
    const token = ([] as string[]).concat(res.headers['set-cookie']).find((c) => c.startsWith(`${SESSION_COOKIE}=`))!.split(';')[0];
    expect((await request(h.app).get('/api/auth/me').set('Cookie', token)).status).toBe(200);
    await client.post('/api/auth/sign-out');
    expect((await request(h.app).get('/api/auth/me').set('Cookie', token)).status).toBe(401);
    // Signing in again at once gives a working session.
    const again = new ApiClient(h.app);
    expect((await again.signIn(person.email, person.password)).status).toBe(200);
    expect((await again.get('/api/auth/me')).status).toBe(200);
  });
});
