import { Router } from 'express';
import type { Database } from '../db/client';
import { apparatusRouter } from './apparatus/apparatus-router';
import { auditRouter } from './audit/audit-router';
import { balanceRouter } from './balance/balance-router';
import type { Config } from './config';
import { exportsRouter } from './exports/exports-router';
import { gasesRouter } from './gases/gases-router';
import { homeRouter } from './home/home-router';
import { importsRouter } from './imports/imports-router';
import { instrumentsRouter } from './instruments/instruments-router';
import type { JobQueue } from './jobs/job-queue';
import { peopleRouter } from './people/people-router';
import { projectsRouter } from './projects/projects-router';
import { runsRouter } from './runs/runs-router';
import { standardizationRouter } from './standardizations/standardization-router';

/** Every signed-in API resource; each router applies its own role checks per route. */
export function apiRoutes(db: Database, config: Config, queue: JobQueue | null): Router {
  const router = Router();
  router.use('/home', homeRouter(db));
  router.use('/balance', balanceRouter(config));
  router.use('/runs', runsRouter(db, config, queue));
  router.use('/instruments', instrumentsRouter(db));
  router.use('/imports', importsRouter(db, config));
  router.use('/', exportsRouter(db, config));
  router.use('/audit', auditRouter(db, config));
  router.use('/people', peopleRouter(db));
  router.use('/projects', projectsRouter(db));
  router.use('/gases', gasesRouter(db));
  router.use('/apparatus', apparatusRouter(db));
  // Standardizations answer /apparatus/:id/standardizations, /apparatus/:id/changes and /apparatus-due.
  router.use('/', standardizationRouter(db, config));
  return router;
}
