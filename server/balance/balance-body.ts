import type { Request } from 'express';
import { assertCleanInput } from '../core/input-hygiene';
import { badRequest } from '../core/problem';

/** POST /api/balance, whose body the global JSON parser leaves to the route (it may be checked in a worker). */
export const isBalancePost = (req: Request): boolean => req.method === 'POST' && /^\/api\/balance\/?$/.test(req.path);

/** Largest run document sent for a stateless check, as every other body. */
export const BALANCE_BODY_LIMIT = '20mb';

/**
 * A body's bytes read as express.json reads them (strict: an object or an array; empty is {}), with the
 * input hygiene of every body.
 */
export function parseDocumentBytes(bytes: Uint8Array): unknown {
  const text = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8');
  if (text.length === 0) return {};
  if (!/^[\s]*[[{]/.test(text)) throw badRequest('The request body is not valid JSON.');
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw badRequest('The request body is not valid JSON.');
  }
  assertCleanInput(body, 'request body');
  return body;
}
