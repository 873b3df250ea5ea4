import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { IMPORTERS } from '../../contract/roles';
import type { Database } from '../../db/client';
import type { Config } from '../config';
import { badRequest } from '../core/problem';
import { idParam } from '../core/route-params';
import { requireRole } from '../core/session';
import { validateBody } from '../core/validate-body';
import { importLimitsFromEnv, type ImportLimits } from './import-limits';
import { tooLarge } from './import-problems';
import { ColumnMapDto, parseCheckBody, parseCommitBody, parseUploadOptions } from './imports-dto';
import { ImportsService } from './imports-service';

/** multer in memory, with its errors turned into problems people can act on. */
function fileUpload(limits: ImportLimits): RequestHandler {
  // Browsers send a file name as raw UTF-8 in the part header; busboy's default (latin1) would store "MÃ¤rz" for "März".
  const single = multer({ storage: multer.memoryStorage(), defParamCharset: 'utf8', limits: { fileSize: limits.maxBytes, files: 1, fields: 10 } }).single('file');
  return (req, res, next) => {
    single(req, res, (err: unknown) => {
      if (!err) return next();
      const code = (err as { code?: string }).code;
      if (code === 'LIMIT_FILE_SIZE') {
        return next(tooLarge(`The file is larger than ${Math.round(limits.maxBytes / 1024 / 1024)} MB, the most Qwell takes in one upload. Split the logger export into smaller files.`));
      }
      if (code === 'LIMIT_UNEXPECTED_FILE' || code === 'LIMIT_FILE_COUNT') return next(badRequest('Send one file in the form field "file".', [{ field: 'file', message: 'one file, in the field "file"' }]));
      return next(badRequest(`The upload could not be read: ${(err as Error).message}. Send the file as multipart/form-data in the field "file".`));
    });
  };
}

/** Spreadsheet import: upload → preview → (check a mapping) → commit; and saved column maps. */
export function importsRouter(db: Database, _config: Config, limits: ImportLimits = importLimitsFromEnv()): Router {
  const service = new ImportsService(db, limits);
  const router = Router();

  router.get('/column-maps', requireRole(...IMPORTERS), async (req, res) => {
    res.json(await service.listColumnMaps(req.person!));
  });

  router.post('/column-maps', requireRole(...IMPORTERS), async (req, res) => {
    const body = await validateBody(ColumnMapDto, req.body);
    const map = await service.createColumnMap(req.person!, body, req.ip ?? null);
    res.status(201).json(map);
  });

  router.post('/', requireRole(...IMPORTERS), fileUpload(limits), async (req, res) => {
    const options = parseUploadOptions((req.body ?? {}) as Record<string, unknown>);
    if (!req.file) throw badRequest('Choose a .xlsx or .csv file to upload (form field "file").', [{ field: 'file', message: 'no file was sent' }]);
    const preview = await service.upload(req.person!, { originalname: req.file.originalname, mimetype: req.file.mimetype, buffer: req.file.buffer }, options, req.ip ?? null);
    res.status(201).location(`/api/imports/${preview.importId}`).json(preview);
  });

  router.get('/:id', requireRole(...IMPORTERS), async (req, res) => {
    res.json(await service.preview(req.person!, idParam(req.params['id'], 'import')));
  });

  router.post('/:id/check', requireRole(...IMPORTERS), async (req, res) => {
    const id = idParam(req.params['id'], 'import');
    res.json(await service.check(req.person!, id, parseCheckBody(req.body)));
  });

  router.post('/:id/commit', requireRole(...IMPORTERS), async (req, res) => {
    const id = idParam(req.params['id'], 'import');
    const body = await parseCommitBody(req.body);
    const result = await service.commit(req.person!, id, body, req.ip ?? null);
    res.status(201).location(`/api/runs/${result.runId}`).json(result);
  });

  return router;
}
