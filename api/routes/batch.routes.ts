/**
 * Batch specs under a project: import many specs from one CSV or JSON file (multipart upload,
 * field `file`; `?dryRun=true` for the per-row report alone), and the results of a batch's
 * proposals as one CSV.
 */
import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import type { DataSource } from 'typeorm';
import { currentUser, requirePermission, requireSignIn } from '../auth/require';
import { AppError, invalid } from '../errors';
import { projectFor } from '../services/projects.service';
import { batchProposalsCsv, importSpecs, MAX_BATCH_PROPOSALS } from '../services/spec-import.service';
import { BATCH_CSV_QUERY, IMPORT_QUERY } from '../validation/bodies';
import { idParam, validateQuery } from '../validation/validate-request';

/** Largest import file (a thousand specs in CSV take about 300 kB). */
export const MAX_IMPORT_BYTES = 1024 * 1024;

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_IMPORT_BYTES, files: 1, fields: 4, parts: 5 },
  defParamCharset: 'utf8', // browsers send UTF-8 file names
}).single('file');

/** The upload parsed into `req.file`; its limits and malformed bodies answer as the API's errors. */
const receiveFile: RequestHandler = (req, res, next) => {
  upload(req, res, (error: unknown) => {
    if (!error) return next();
    if (error instanceof multer.MulterError) {
      if (error.code === 'LIMIT_FILE_SIZE') return next(new AppError('file-too-large', 413, 'The file is too large.', [{ path: 'file', message: `is over ${MAX_IMPORT_BYTES / 1024 / 1024} MB` }]));
      if (error.code === 'LIMIT_UNEXPECTED_FILE') return next(invalid([{ path: error.field ?? 'file', message: 'is not expected: send one file in the field "file"' }]));
      return next(invalid([{ path: '', message: `the upload was refused (${error.message.toLowerCase()})` }]));
    }
    const message = error instanceof Error ? error.message : '';
    if (/multipart|unexpected end of form|boundary|malformed part header/i.test(message)) return next(invalid([{ path: '', message: 'is not a readable multipart/form-data upload' }]));
    next(error);
  });
};

/** 404 before the upload is read when the project is not the caller's, 403 when the caller's role there may not write specs. */
function visibleProject(dataSource: DataSource): RequestHandler {
  return async (req, _res, next) => {
    await projectFor(dataSource, currentUser(req), idParam(req.params.id, 'project'), 'specs:write');
    next();
  };
}

export function batchRoutes(dataSource: DataSource): Router {
  const router = Router();
  router.use(requireSignIn);
  router.post('/:id/specs/import', requirePermission('specs:write'), validateQuery(IMPORT_QUERY), visibleProject(dataSource), receiveFile, async (req, res) => {
    if (!req.file) throw invalid([{ path: 'file', message: 'is required: send the CSV or JSON file as multipart/form-data in the field "file"' }]);
    const { dryRun } = res.locals.query as { dryRun: 'true' | 'false' };
    const file = { buffer: req.file.buffer, originalName: req.file.originalname, mimeType: req.file.mimetype };
    res.json(await importSpecs(dataSource, currentUser(req), idParam(req.params.id, 'project'), file, { dryRun: dryRun === 'true' }));
  });
  router.get('/:id/proposals.csv', validateQuery(BATCH_CSV_QUERY), async (req, res) => {
    const text = String((res.locals.query as { ids: unknown }).ids);
    if (!/^[1-9]\d*(,[1-9]\d*)*$/.test(text)) throw invalid([{ path: '?ids', message: 'must be proposal ids separated by commas, e.g. ids=12,13,14' }]);
    const ids = text.split(',').map(Number);
    if (ids.length > MAX_BATCH_PROPOSALS) throw invalid([{ path: '?ids', message: `names ${ids.length} proposals; at most ${MAX_BATCH_PROPOSALS}` }]);
    const projectId = idParam(req.params.id, 'project');
    const csv = await batchProposalsCsv(dataSource, currentUser(req), projectId, ids);
    res.attachment(`longtail-batch-project-${projectId}.csv`).type('text/csv; charset=utf-8').send(csv);
  });
  return router;
}
