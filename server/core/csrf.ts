import type { RequestHandler } from 'express';
import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { Config } from '../config';
import { forbidden } from './problem';

// Angular's HttpClient reads this cookie and echoes it in the header on mutating requests.
export const XSRF_COOKIE = 'XSRF-TOKEN';
export const XSRF_HEADER = 'x-xsrf-token';
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Double-submit cookie CSRF protection for every state-changing request under /api. */
export function csrfProtection(config: Config): RequestHandler {
  return (req, res, next) => {
    let token: unknown = req.cookies?.[XSRF_COOKIE];
    if (typeof token !== 'string' || token.length < 32) {
      token = randomBytes(32).toString('base64url');
      res.cookie(XSRF_COOKIE, token, { sameSite: 'strict', secure: config.secureCookies, path: '/', httpOnly: false });
      if (SAFE.has(req.method)) return next();
      return next(forbidden('The request has no CSRF token. Reload the page and try again.'));
    }
    if (SAFE.has(req.method)) return next();
    const header = req.get(XSRF_HEADER) ?? '';
    const a = Buffer.from(header);
    const b = Buffer.from(token as string);
    if (a.length !== b.length || !timingSafeEqual(a, b)) {
      return next(forbidden('The request has a missing or wrong CSRF token. Reload the page and try again.'));
    }
    next();
  };
}
