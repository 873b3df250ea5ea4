import { Router } from 'express';
import type { HistoryPage, RunChecklistResponse } from '../../contract/api/runs';
import { REVIEWERS, RUN_AUTHORS, RUN_READERS } from '../../contract/roles';
import type { Wire } from '../../contract/wire';
import type { Database } from '../../db/client';
import type { Config } from '../config';
import { badRequest } from '../core/problem';
import { ReadCache } from '../core/read-cache';
import { idParam } from '../core/route-params';
import { requireRole } from '../core/session';
import { validateBody } from '../core/validate-body';
import { validateQuery } from '../core/validate-query';
import { balanceResponse } from '../balance/balance-response';
import type { JobQueue } from '../jobs/job-queue';
import { isReviewAction, SignatureDto } from './review-dto';
import { ReviewService } from './review-service';
import { readingsBody, type ReadingsFeed } from './readings-body';
import { CreateRunDto, ReviseDto, RunListQuery, UpdateRunDto, VersionDto } from './runs-dto';
import { RunsService } from './runs-service';
import { assertValidSetup } from './setup-validation';
import { countReadings, runChecklist } from './submit-checklist';

export function runsRouter(db: Database, config: Config, queue: JobQueue | null): Router {
  const service = new RunsService(db, config, queue);
  const review = new ReviewService(db, config);
  // The list and the stored results are read far more often than runs change.
  const reads = new ReadCache(2000, config.readCache);
  const router = Router();

  router.get('/', requireRole(...RUN_READERS), async (req, res) => {
    await reads.json(req, res, async () => service.list(req.person!, await validateQuery(RunListQuery, req.query)));
  });

  router.post('/', requireRole(...RUN_AUTHORS), async (req, res) => {
    const body = await validateBody(CreateRunDto, req.body);
    if (body.setup !== undefined) assertValidSetup(body.setup);
    const run = await service.create(req.person!, body, [], req.ip ?? null);
    res.status(201).location(`/api/runs/${run.id}`).json(run);
  });

  router.get('/:id', requireRole(...RUN_READERS), async (req, res) => {
    res.json(await service.get(req.person!, idParam(req.params['id'], 'run')));
  });

  router.patch('/:id', requireRole(...RUN_AUTHORS), async (req, res) => {
    const body = await validateBody(UpdateRunDto, req.body);
    if (body.setup !== undefined) assertValidSetup(body.setup);
    res.json(await service.update(req.person!, idParam(req.params['id'], 'run'), body, req.ip ?? null));
  });

  router.put('/:id/readings', requireRole(...RUN_AUTHORS), readingsBody(), async (req, res) => {
    const feed = res.locals['readings'] as ReadingsFeed;
    res.json(await service.replaceReadings(req.person!, idParam(req.params['id'], 'run'), feed, req.ip ?? null));
  });

  router.post('/:id/submit', requireRole(...RUN_AUTHORS), async (req, res) => {
    const body = await validateBody(VersionDto, req.body);
    const run = await service.submit(req.person!, idParam(req.params['id'], 'run'), body.version, req.ip ?? null);
    res.status(202).json(run);
  });

  router.get('/:id/balance', requireRole(...RUN_READERS), async (req, res) => {
    await reads.json(req, res, async () => {
      const { run, row } = await service.latestResult(req.person!, idParam(req.params['id'], 'run'));
      return balanceResponse(run, row);
    });
  });

  /** What a draft still lacks before submit, in the form's words; changes nothing. */
  router.get('/:id/checklist', requireRole(...RUN_READERS), async (req, res) => {
    const id = idParam(req.params['id'], 'run');
    res.json((await runChecklist(db, req.person!, id, config.labName, (runId) => countReadings(db, runId))) satisfies Wire<RunChecklistResponse>);
  });

  router.get('/:id/history', requireRole(...RUN_READERS), async (req, res) => {
    res.json((await service.history(req.person!, idParam(req.params['id'], 'run'))) satisfies Wire<HistoryPage>);
  });

  router.get('/:id/document', requireRole(...RUN_READERS), async (req, res) => {
    const doc = await service.document(req.person!, idParam(req.params['id'], 'run'));
    res.type('application/json').attachment(`${doc.id?.replace('/', '-r') ?? 'run'}.qwell.json`).send(JSON.stringify(doc, null, 2));
  });

  router.post('/:id/revisions', requireRole(...RUN_AUTHORS), async (req, res) => {
    const body = await validateBody(ReviseDto, req.body);
    const revision = await review.revise(req.person!, idParam(req.params['id'], 'run'), body.reason, req.ip ?? null);
    res.status(201).location(`/api/runs/${revision.id}`).json(revision);
  });

  router.post('/:id/:action', requireRole(...REVIEWERS), async (req, res) => {
    const action = String(req.params['action']);
    if (!isReviewAction(action)) throw badRequest(`Unknown run action "${action}"; use approve, return or reject.`);
    const body = await validateBody(SignatureDto, req.body);
    res.json(await review.decide(req.person!, idParam(req.params['id'], 'run'), action, body, req.ip ?? null));
  });

  return router;
}
