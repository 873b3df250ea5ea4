import express, { type Request, type RequestHandler } from 'express';
import { assertCleanInput } from '../core/input-hygiene';
import { badRequest } from '../core/problem';
import type { ReplaceReadingsDto } from './runs-dto';

/** PUT /api/runs/:id/readings, whose body the global JSON parser leaves to readingsJson. */
export const isReadingsPut = (req: Request): boolean => req.method === 'PUT' && /^\/api\/runs\/[^/]+\/readings\/?$/.test(req.path);

/** Largest readings body (QWELL_READINGS_MAX_MB, default 256): 10⁶ time points of six channels are about 90 MB of JSON. */
export function readingsMaxMb(): number {
  const raw = Number(process.env['QWELL_READINGS_MAX_MB'] ?? 256);
  return Number.isFinite(raw) && raw > 0 ? raw : 256;
}

/** The readings route's JSON parser (after the role check), with the same hygiene as every other body. */
export function readingsJson(): RequestHandler {
  const parse = express.json({ limit: `${readingsMaxMb()}mb` });
  return (req, res, next) => parse(req, res, (err?: unknown) => {
    if (err) return next(err);
    try {
      assertCleanInput(req.body, 'request body');
      next();
    } catch (problem) {
      next(problem);
    }
  });
}

/**
 * The readings body checked by hand rather than through class-transformer, which would copy every
 * one of millions of values into new arrays: { version, time, channels } and nothing else; the
 * shapes of time and channels are parseReadingsInput's to check.
 */
export function parseReplaceReadingsBody(body: unknown): ReplaceReadingsDto {
  if (body === null || typeof body !== 'object' || Array.isArray(body)) throw badRequest('The request body must be a JSON object.');
  const b = body as Record<string, unknown>;
  const errors = [];
  if (!Number.isInteger(b['version'])) errors.push({ field: 'version', message: 'version must be the version of the run you are editing (a whole number)' });
  for (const key of Object.keys(b)) if (!['version', 'time', 'channels'].includes(key)) errors.push({ field: key, message: `property ${key} should not exist` });
  if (errors.length) throw badRequest(errors.map((e) => e.message).join('; '), errors);
  return b as unknown as ReplaceReadingsDto;
}
