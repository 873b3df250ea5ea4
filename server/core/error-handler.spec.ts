import express from 'express';
import request from 'supertest';
import { errorHandler } from './error-handler';

// Errors from PostgreSQL that reach the handler (Drizzle wraps the driver's error as its cause).
function appThrowing(error: unknown) {
  const app = express();
  app.get('/x', () => {
    throw error;
  });
  app.use(errorHandler);
  return app;
}

const pgError = (code: string, extra: Record<string, unknown> = {}) => Object.assign(new Error('Failed query'), { cause: { code, ...extra } });

describe('errorHandler and database refusals', () => {
  it.each([
    ['23505', 409, /same identifying value/],
    ['23503', 409, /does not exist/],
    ['22008', 400, /out of range or not of the right kind/],
    ['22P02', 400, /out of range or not of the right kind/],
  ])('answers SQLSTATE %s with %i and a plain reason', async (code, status, detail) => {
    const res = await request(appThrowing(pgError(code))).get('/x');
    expect(res.status).toBe(status);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.detail).toMatch(detail);
  });

  it('names the empty column of a not-null refusal (SQLSTATE 23502)', async () => {
    const res = await request(appThrowing(pgError('23502', { column_name: 'run_date' }))).get('/x');
    expect(res.status).toBe(400);
    expect(res.body.detail).toBe('A required value is missing (run_date); nothing was changed.');
  });

  it('answers anything else with 500 and a reference, never the error text or a stack', async () => {
    const res = await request(appThrowing(new Error('secret internals at /work/main/server'))).get('/x');
    expect(res.status).toBe(500);
    expect(res.body.detail).toMatch(/Quote reference [0-9a-f-]{36}/);
    expect(JSON.stringify(res.body)).not.toMatch(/secret internals|\/work\/main/);
  });
});
