import { and, eq, sql } from 'drizzle-orm';
import express from 'express';
import request from 'supertest';
import { dataVersions, people, projectMembers, runs } from '../../db/schema';
import { demoEmail } from '../../db/seed/demo-lab';
import { clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';
import { ReadCache } from './read-cache';

describe('ReadCache', () => {
  // A tiny app whose "records version" comes from a header, to drive the cache directly.
  function appWith(cache: ReadCache) {
    let loads = 0;
    const app = express();
    app.get('/thing', async (req, res) => {
      const header = req.get('x-version');
      if (header !== undefined) req.recordsVersion = Number(header);
      await cache.json(req, res, async () => ({ load: ++loads }));
    });
    return app;
  }

  it('serves a kept answer while the version stays, and loads again when it moves', async () => {
    const app = appWith(new ReadCache());
    const first = await request(app).get('/thing').set('x-version', '5');
    const again = await request(app).get('/thing').set('x-version', '5');
    expect(first.body).toEqual({ load: 1 });
    expect(again.body).toEqual({ load: 1 });
    expect(again.headers['etag']).toBe(first.headers['etag']);
    const notModified = await request(app).get('/thing').set('x-version', '5').set('If-None-Match', first.headers['etag']);
    expect(notModified.status).toBe(304);
    expect((await request(app).get('/thing').set('x-version', '6')).body).toEqual({ load: 2 });
  });

  it('reads through without keeping anything for an older version or no version', async () => {
    const cache = new ReadCache();
    const app = appWith(cache);
    await request(app).get('/thing').set('x-version', '9');
    expect((await request(app).get('/thing').set('x-version', '8')).body).toEqual({ load: 2 });
    expect((await request(app).get('/thing')).body).toEqual({ load: 3 });
    expect(cache.size).toBe(1);
    // The answer kept for version 9 is still the one served at version 9.
    expect((await request(app).get('/thing').set('x-version', '9')).body).toEqual({ load: 1 });
  });

  it('shares one load among the requests that arrive together after a change', async () => {
    const cache = new ReadCache();
    let loads = 0;
    // The load lasts until all four requests have reached the handler, so they arrive "together" by construction
    // rather than within a 100 ms sleep that a loaded machine can outlast.
    let arrived = 0;
    let allArrived!: () => void;
    const together = new Promise<void>((resolve) => (allArrived = resolve));
    const app = express();
    app.get('/slow', async (req, res) => {
      req.recordsVersion = 1;
      if (++arrived === 4) allArrived();
      await cache.json(req, res, async () => {
        loads += 1;
        await together;
        return { loads };
      });
    });
    const server = app.listen(0, '127.0.0.1');
    try {
      const answers = await Promise.all([1, 2, 3, 4].map(() => request(server).get('/slow')));
      expect(loads).toBe(1);
      expect(answers.map((a) => a.body)).toEqual([{ loads: 1 }, { loads: 1 }, { loads: 1 }, { loads: 1 }]);
      expect(answers[0].headers['content-type']).toMatch(/^application\/json/);
    } finally {
      server.close();
    }
  });

  it('sends a large answer gzipped to a client that accepts gzip, and plain to one that does not', async () => {
    const cache = new ReadCache();
    const big = { rows: Array.from({ length: 200 }, (_, i) => ({ i, title: `Run ${i}` })) };
    const app = express();
    app.get('/big', async (req, res) => {
      req.recordsVersion = 1;
      await cache.json(req, res, async () => big);
    });
    const zipped = await request(app).get('/big').set('Accept-Encoding', 'gzip');
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.body).toEqual(big); // supertest unzips
    expect(Number(zipped.headers['content-length'])).toBeLessThan(JSON.stringify(big).length / 3);
    const plain = await request(app).get('/big').set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(Number(plain.headers['content-length'])).toBe(Buffer.byteLength(JSON.stringify(big)));
    expect(plain.headers['vary']).toMatch(/Accept-Encoding/);
  });

  it('keeps at most its maximum number of answers', async () => {
    const cache = new ReadCache(3);
    const app = appWith(cache);
    for (let i = 0; i < 7; i++) await request(app).get(`/thing?page=${i}`).set('x-version', '1');
    expect(cache.size).toBeLessThanOrEqual(3);
  });
});

describe('records version and the cached run list (real database)', () => {
  let h: ApiHarness;
  beforeAll(async () => {
    h = await startHarness();
  });
  afterAll(() => h.close());

  const version = async () => (await h.handle.db.select({ v: dataVersions.version }).from(dataVersions).where(eq(dataVersions.name, 'records')))[0].v;

  it('counts one step per committed transaction that changes runs, none for a rollback or a failed sign-in', async () => {
    const before = await version();
    const [a, b] = await h.handle.db.select({ id: runs.id }).from(runs).orderBy(runs.id).limit(2);
    await h.handle.db.transaction(async (tx) => {
      await tx.update(runs).set({ updatedAt: sql`updated_at` }).where(eq(runs.id, a.id));
      await tx.update(runs).set({ updatedAt: sql`updated_at` }).where(eq(runs.id, b.id));
    });
    expect(await version()).toBe(before + 1);
    await expect(h.handle.db.transaction(async (tx) => {
      await tx.update(runs).set({ updatedAt: sql`updated_at` }).where(eq(runs.id, a.id));
      throw new Error('roll back');
    })).rejects.toThrow('roll back');
    expect(await version()).toBe(before + 1);
    const stranger = await clientAs(h.app, null);
    expect((await stranger.signIn(demoEmail('technician'), 'not the password at all')).status).toBe(401);
    expect(await version()).toBe(before + 1);
  });

  it('shows a change committed by another process (straight into the database) on the next read', async () => {
    const tech = await clientAs(h.app, 'technician');
    const url = '/api/runs?sort=code&dir=asc&pageSize=100';
    const first = await tech.get(url);
    const target = first.body.items[0] as { id: number; title: string };
    expect((await tech.get(url)).body).toEqual(first.body);
    await h.handle.db.update(runs).set({ title: `${target.title} (renamed elsewhere)` }).where(eq(runs.id, target.id));
    try {
      const after = await tech.get(url);
      expect(after.body.items.find((r: { id: number }) => r.id === target.id).title).toBe(`${target.title} (renamed elsewhere)`);
      const balance = await tech.get(`/api/runs/${target.id}/balance`);
      expect([200, 404]).toContain(balance.status);
    } finally {
      await h.handle.db.update(runs).set({ title: target.title }).where(eq(runs.id, target.id));
    }
  });

  it('follows a change of project membership: a run of a project one has left is no longer listed', async () => {
    const tech = await clientAs(h.app, 'technician');
    const [me] = await h.handle.db.select({ id: people.id }).from(people).where(eq(people.email, demoEmail('technician')));
    const url = '/api/runs?pageSize=100';
    const before = await tech.get(url);
    const projectId = (before.body.items[0] as { projectId: number }).projectId;
    await h.handle.db.delete(projectMembers).where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.personId, me.id)));
    try {
      const after = await tech.get(url);
      expect(after.body.items.some((r: { projectId: number }) => r.projectId === projectId)).toBe(false);
      expect(after.body.total).toBeLessThan(before.body.total);
    } finally {
      await h.handle.db.insert(projectMembers).values({ projectId, personId: me.id });
    }
    expect((await tech.get(url)).body.total).toBe(before.body.total);
  });
});
