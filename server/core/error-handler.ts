import type { ErrorRequestHandler, RequestHandler } from 'express';
import { randomUUID } from 'node:crypto';
import { HttpProblem } from './problem';

const problemType = (status: number) => `https://qwell.invalid/problems/${status}`;

/** Unknown /api routes answer a problem, not the client's index.html. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpProblem(404, 'Not found', `There is no API route ${req.method} ${req.originalUrl.split('?')[0]}.`));
};

/** The PostgreSQL error code of a failed query (Drizzle wraps the driver's error as its cause). */
function pgCode(err: { code?: unknown; cause?: { code?: unknown } } | undefined): string | undefined {
  const code = err?.cause?.code ?? err?.code;
  return typeof code === 'string' ? code : undefined;
}

/**
 * Errors of the driver or the server that mean "the database cannot be reached right now", not "this
 * request is wrong": refused or dropped connections, timeouts, a server shutting down or starting up.
 */
const UNREACHABLE = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'ENOTFOUND', 'EHOSTUNREACH', 'CONNECT_TIMEOUT', 'CONNECTION_CLOSED',
  'CONNECTION_ENDED', 'CONNECTION_DESTROYED', '57P01', '57P02', '57P03', '53300',
]);

export function isDatabaseUnreachable(err: unknown): boolean {
  for (let e = err as { code?: unknown; cause?: unknown; errors?: unknown[] } | undefined, i = 0; e && i < 5; e = e.cause as typeof e, i++) {
    if (typeof e.code === 'string' && UNREACHABLE.has(e.code)) return true;
    // Node reports a refused connection to "localhost" on both addresses as an AggregateError.
    if (Array.isArray(e.errors) && e.errors.some((inner) => isDatabaseUnreachable(inner))) return true;
  }
  return false;
}

/** 503 while PostgreSQL cannot be reached: nothing was changed, and trying again later will work. */
export const databaseUnavailable = () => new HttpProblem(503, 'Service unavailable',
  'The database cannot be reached at the moment, so Qwell cannot read or save anything. Nothing was changed; try again in a minute, and tell the lab\'s administrator if it lasts.',
  undefined, { retryAfter: 30 });

/** The single error handler: every failure leaves as application/problem+json, never a stack trace. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  let problem: HttpProblem;
  if (err instanceof HttpProblem) {
    problem = err;
  } else if (err?.type === 'entity.parse.failed') {
    problem = new HttpProblem(400, 'Bad request', 'The request body is not valid JSON.');
  } else if (pgCode(err) === '23505') {
    // A unique index refused the write: two people created the same thing at the same moment.
    problem = new HttpProblem(409, 'Conflict', 'A record with the same identifying value exists already; nothing was changed. Reload and try again.');
  } else if (pgCode(err) === '23503') {
    problem = new HttpProblem(409, 'Conflict', 'The change refers to a record that does not exist (or is still referred to); nothing was changed.');
  } else if (pgCode(err) === '23502') {
    // A column that cannot be empty was left empty: validation should have said so, but the database holds the line.
    const column = err?.cause?.column_name ?? err?.column_name;
    problem = new HttpProblem(400, 'Bad request', `A required value is missing${column ? ` (${column})` : ''}; nothing was changed.`);
  } else if (['22007', '22008', '22003', '22P02'].includes(pgCode(err) ?? '')) {
    // A date that does not exist, a number out of range, text where a number belongs.
    problem = new HttpProblem(400, 'Bad request', 'A value is out of range or not of the right kind (a date that does not exist, say); nothing was changed.');
  } else if (['22021', '22P05'].includes(pgCode(err) ?? '')) {
    // A character PostgreSQL cannot store (NUL): the input hygiene refuses these first; this is the backstop.
    problem = new HttpProblem(400, 'Bad request', 'A value contains a character that cannot be stored (a NUL or other control character); nothing was changed.');
  } else if (isDatabaseUnreachable(err)) {
    problem = databaseUnavailable();
  } else if (err?.type === 'entity.too.large') {
    problem = new HttpProblem(413, 'Too large', 'The request body is larger than the server accepts.');
  } else {
    const reference = randomUUID();
    req.log?.error({ err, reference }, 'unhandled error');
    problem = new HttpProblem(
      500,
      'Server error',
      `Something went wrong on the server and nothing was changed. Quote reference ${reference} when you report it.`,
    );
  }
  if (res.headersSent) return;
  if (problem.status === 503) res.setHeader('Retry-After', '30');
  res
    .status(problem.status)
    .type('application/problem+json')
    .json({
      type: problemType(problem.status),
      title: problem.title,
      status: problem.status,
      detail: problem.detail,
      instance: req.originalUrl,
      ...(problem.errors ? { errors: problem.errors } : {}),
      ...problem.extra,
    });
};
