/**
 * Batch specs under a project: import many specs from one CSV or JSON file (multipart upload,
 * field `file`; `?dryRun=true` for the per-row report alone), and the results of a batch's
 * proposals as one CSV.
 */
import { Router, type RequestHandler } from 'express';
import type { DataSource } from 'typeorm';
import { currentUser, requirePermission, requireSignIn } from '../auth/require';
import { invalid } from '../errors';
import { projectFor } from '../services/projects.service';
import { batchProposalsCsv, importSpecs, MAX_BATCH_PROPOSALS } from '../services/spec-import.service';
import { BATCH_CSV_QUERY, IMPORT_QUERY } from '../validation/bodies';
import { fileUpload } from '../uploads';
import { idParam, validateQuery } from '../validation/validate-request';

/** Largest import file (a thousand specs in CSV take about 300 kB). */
export const MAX_IMPORT_BYTES = 1024 * 1024;

/** The import file; other form fields are tolerated and ignored (the options are in the query). */
const importFile = fileUpload({
  field: 'file',
  maxBytes: MAX_IMPORT_BYTES,
  what: 'the CSV or JSON file of specs',
  sizeNote: 'a thousand specs in CSV take about 300 kB',
  textFields: { count: 4 },
});

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
  router.post('/:id/specs/import', requirePermission('specs:write'), validateQuery(IMPORT_QUERY), visibleProject(dataSource), importFile.receive, async (req, res) => {
    const { originalName, bytes, mimeType } = importFile.file(req);
    const { dryRun } = res.locals.query as { dryRun: 'true' | 'false' };
    const file = { buffer: bytes, originalName, mimeType };
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
