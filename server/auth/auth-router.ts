import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import type { Database } from '../../db/client';
import type { Config } from '../config';
import { HttpProblem } from '../core/problem';
import { clearSession, issueSession, requireSignIn } from '../core/session';
import { validateBody } from '../core/validate-body';
import { SignInDto } from './auth-dto';
import { AuthService } from './auth-service';

export function authRouter(db: Database, config: Config): Router {
  const service = new AuthService(db, config);
  const router = Router();

  // Per client address, on top of the per-account lockout in AuthService.
  const signInLimiter = rateLimit({
    windowMs: config.signInRateWindowMs,
    limit: config.signInRateLimit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) =>
      next(new HttpProblem(429, 'Too many sign-in attempts', 'Too many sign-in attempts from this computer. Wait 15 minutes and try again.')),
  });

  router.post('/sign-in', signInLimiter, async (req, res) => {
    const body = await validateBody(SignInDto, req.body);
    const person = await service.signIn(body.email, body.password, req.ip ?? null);
    await issueSession(res, config, person);
    res.json({ person });
  });

  router.post('/sign-out', requireSignIn, async (req, res) => {
    await service.signOut(req.person!, req.ip ?? null);
    clearSession(res, config);
    res.status(204).end();
  });

  router.get('/me', requireSignIn, (req, res) => {
    res.json({ person: req.person });
  });

  return router;
}
