import 'reflect-metadata';
import compression from 'compression';
import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import pino from 'pino';
import { pinoHttp } from 'pino-http';
import type { DbHandle } from '../db/client';
import { authRouter } from './auth/auth-router';
import type { Config } from './config';
import { csrfProtection } from './core/csrf';
import { brotliStatic } from './core/brotli-static';
import { apiNotFound, errorHandler } from './core/error-handler';
import { inputHygiene } from './core/input-hygiene';
import { sessionReader } from './core/session';
import { healthRouter } from './health/health-router';
import type { JobQueue } from './jobs/job-queue';
import { apiRoutes } from './routes';
import { isReadingsPut } from './runs/readings-body';
import { isBalancePost } from './balance/balance-body';

/** Builds the Express app: security, logging, routers, then the API 404 and the one error handler. */
export function createApp(config: Config, handle: DbHandle, queue: JobQueue | null = null): Express {
  const app = express();
  app.disable('x-powered-by');
  // Off unless a setting names the proxy: otherwise any client could choose its address (and its
  // sign-in limit) with X-Forwarded-For.
  app.set('trust proxy', config.trustProxy);

  // Over plain HTTP on loopback, upgrading requests or pinning HTTPS would break the app.
  app.use(helmet({
    contentSecurityPolicy: { directives: { upgradeInsecureRequests: config.secureCookies ? [] : null } },
    strictTransportSecurity: config.secureCookies,
  }));
  const logger = pino({ level: config.logLevel });
  // pino-http logs each finished request at "info"; below that level a request only needs req.log.
  app.use(logger.isLevelEnabled('info')
    ? pinoHttp({
      logger,
      autoLogging: { ignore: (req) => !req.url?.startsWith('/api') },
      // Method, path and status are enough; headers would log cookies.
      serializers: {
        req: (req: { id: unknown; method: string; url: string }) => ({ id: req.id, method: req.method, url: req.url }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
    })
    : (req, _res, next) => {
      req.log = logger;
      next();
    });
  app.use(cookieParser());
  // Readings replaced in one PUT may be large (10⁶ time points), and so may a document sent for a
  // stateless check: those routes read their own bodies after the sign-in and role checks, large ones
  // in a worker thread (server/runs/readings-body.ts, server/balance/balance-body.ts). Every other body: 20 MB at most.
  const json = express.json({ limit: '20mb' });
  app.use((req, res, next) => (isReadingsPut(req) || isBalancePost(req) ? next() : json(req, res, next)));
  // Before any router: NUL and other control characters, bodies nested too deep and prototype keys are refused.
  app.use('/api', inputHygiene);

  app.use('/api/health', healthRouter(handle.sql));
  app.use('/api', csrfProtection(config), sessionReader(config, handle.db));
  app.use('/api/auth', authRouter(handle.db, config));
  app.use('/api', apiRoutes(handle.db, config, queue));
  app.use('/api', apiNotFound);

  if (existsSync(join(config.staticDir, 'index.html'))) {
    // The app's own files only (the API answered above): compressed (brotli or gzip, as the browser
    // accepts), so a first visit fetches a fraction of the built JS and CSS.
    app.use(brotliStatic(config.staticDir, 3600));
    app.use(compression());
    app.use(express.static(config.staticDir, { index: false, maxAge: '1h' }));
    // Client-side routes (e.g. /runs/12) all load the app shell; the router takes it from there.
    app.get('/{*splat}', (_req, res) => res.sendFile(join(config.staticDir, 'index.html')));
  }

  app.use(errorHandler);
  return app;
}
