import express from 'express';
import request from 'supertest';
import { errorHandler } from '../core/error-handler';
import { clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('security checks (docs/SECURITY.md maps each to OWASP ASVS)', () => {
  it('answers an unexpected failure with a reference, never a stack trace or the error text', async () => {
    const app = express();
    app.get('/boom', () => {
      throw new Error('secret detail from deep inside at /srv/qwell/server/x.ts:12');
    });
    app.use(errorHandler);
    const res = await request(app).get('/boom');
    expect(res.status).toBe(500);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(JSON.stringify(res.body)).not.toMatch(/secret detail|\.ts:|at /);
    expect(res.body.detail).toMatch(/Quote reference [0-9a-f-]{36}/);
  });

  it('refuses a new password shorter than 12 characters', async () => {
    const admin = await clientAs(h.app, 'admin');
    const res = await admin.post('/api/people', { email: `short-${Date.now()}@sec.test`, name: 'Short Password', role: 'technician', password: 'elevenchars' });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([expect.objectContaining({ field: 'password', message: 'password must be at least 12 characters' })]);
    const ok = await admin.post('/api/people', { email: `long-${Date.now()}@sec.test`, name: 'Long Password', role: 'technician', password: 'twelve-chars' });
    expect(ok.status).toBe(201);
  });

  it.each([
    ['/api/runs?state=draft%27%20OR%201%3D1--', 'state'],
    ['/api/runs?project=1%3BDROP%20TABLE%20runs', 'project'],
    ['/api/runs?sort=updated_at%3Bselect%201', 'sort'],
    ['/api/runs?dir=desc%2C%20(select%201)', 'dir'],
    ['/api/audit?action=run.submit%27%20or%20%271%27%3D%271', 'action'],
    ['/api/audit?from=2026-01-01%27%3B--', 'from'],
  ])('refuses the injection attempt %s with a 400 naming %s', async (url, field) => {
    const quality = await clientAs(h.app, 'quality');
    const res = await quality.get(url);
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { field: string }) => e.field)).toContain(field);
  });

  it('refuses a JSON body that is not JSON, and an oversized body, without a stack trace', async () => {
    const tech = await clientAs(h.app, 'technician');
    const bad = await tech.agent.post('/api/runs').set('X-XSRF-TOKEN', tech.xsrfToken).set('Content-Type', 'application/json').send('{"title": ');
    expect(bad.status).toBe(400);
    expect(bad.body.detail).toBe('The request body is not valid JSON.');
    const huge = await tech.agent.post('/api/balance').set('X-XSRF-TOKEN', tech.xsrfToken).set('Content-Type', 'application/json')
      .send(`{"pad":"${'x'.repeat(21 * 1024 * 1024)}"}`);
    expect(huge.status).toBe(413);
  });

  it('does not let a prototype-polluting body change objects', async () => {
    const tech = await clientAs(h.app, 'technician');
    await tech.agent.post('/api/balance').set('X-XSRF-TOKEN', tech.xsrfToken).set('Content-Type', 'application/json').send('{"__proto__": {"polluted": true}, "format": "qwell.run"}');
    expect(({} as Record<string, unknown>)['polluted']).toBeUndefined();
  });
});
