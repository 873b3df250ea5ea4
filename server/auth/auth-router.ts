import type { Request } from 'express';
import { Router } from 'express';
import { ipKeyGenerator, rateLimit, type RateLimitRequestHandler } from 'express-rate-limit';
import type { Database } from '../../db/client';
import type { Config } from '../config';
import { clientIp } from '../core/client-ip';
import { HttpProblem } from '../core/problem';
import { clearSession, issueSession, requireSignIn } from '../core/session';
import { validateBody } from '../core/validate-body';
import { SignInDto } from './auth-dto';
import { AuthService } from './auth-service';
import { waitText } from './password-attempts';

/**
 * Failed sign-ins (any answer of 400 or more) per key per window; successful ones are not counted,
 * so a class behind one address does not lock itself out. The answer states the limiter's real wait.
 */
function failureLimiter(config: Config, what: string, key: (req: Request) => string): RateLimitRequestHandler {
  return rateLimit({
    windowMs: config.signInRateWindowMs,
    limit: config.signInRateLimit,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: key,
    handler: (req, _res, next) => {
      const reset = (req as Request & { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime ?? new Date(Date.now() + config.signInRateWindowMs);
      next(new HttpProblem(429, 'Too many sign-in attempts', `Too many failed sign-ins ${what}. Try again ${waitText(reset)}.`, undefined, { retryAt: reset.toISOString() }));
    },
  });
}

export function authRouter(db: Database, config: Config): Router {
  const service = new AuthService(db, config);
  const router = Router();

  // Per client address and per account address, on top of the per-account lockout in AuthService.
  const perAddress = failureLimiter(config, 'from this computer', (req) => `ip:${ipKeyGenerator(clientIp(req) ?? 'unknown')}`);
  const perAccount = failureLimiter(config, 'for this account', (req) => {
    const email = (req.body as { email?: unknown } | undefined)?.email;
    return `account:${typeof email === 'string' ? email.trim().toLowerCase() : ''}`;
  });

  router.post('/sign-in', perAddress, perAccount, async (req, res) => {
    const body = await validateBody(SignInDto, req.body);
    const person = await service.signIn(body.email, body.password, clientIp(req));
    await issueSession(res, config, person);
    res.json({ person });
  });

  router.post('/sign-out', requireSignIn, async (req, res) => {
    await service.signOut(req.person!, clientIp(req));
    clearSession(res, config);
    res.status(204).end();
  });

  router.get('/me', requireSignIn, (req, res) => {
    res.json({ person: req.person });
  });

  return router;
}
