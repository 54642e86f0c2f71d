/**
 * A project's device library: `GET` lists a page of its NPN .model cards (anyone who sees the
 * project), `GET /recorded?name=&checksum=` resolves the card a spec recorded, `GET /:deviceId`
 * answers one card (retired ones included); `POST` uploads a text file of cards as
 * multipart/form-data in the field `file`, `PUT /:deviceId` replaces a card with the one card of
 * such a file, `DELETE /:deviceId` removes it (the roles with 'devices:write'). The file is held
 * in memory (at most MODEL_FILE_MAX_BYTES) and read as text by shared/devices/model-card.ts; the
 * CSRF header applies as to every state-changing request.
 */
import { Router, type Request, type RequestHandler } from 'express';
import multer from 'multer';
import type { DataSource } from 'typeorm';
import { MODEL_FILE_MAX_BYTES } from '../../shared/devices/model-card';
import { currentUser, requirePermission, requireSignIn } from '../auth/require';
import { AppError, invalid } from '../errors';
import { getDeviceModel, listDeviceModels, recordedDeviceModel, removeDeviceModel, replaceDeviceModel, uploadDeviceModels, type DeviceListQuery } from '../services/devices.service';
import { DEVICE_LIST_QUERY, DEVICE_RECORDED_QUERY } from '../validation/bodies';
import { idParam, validateQuery } from '../validation/validate-request';

/** The multipart form field that carries the file. */
export const MODEL_FILE_FIELD = 'file';

const upload = multer({
  storage: multer.memoryStorage(),
  // One file, no other fields; the size limit answers 413 below.
  limits: { fileSize: MODEL_FILE_MAX_BYTES, files: 1, fields: 0, parts: 1, fieldNameSize: 100, headerPairs: 20 },
  // Browsers send file names as UTF-8 bytes.
  defParamCharset: 'utf8',
}).single(MODEL_FILE_FIELD);

const KB = MODEL_FILE_MAX_BYTES / 1024;

/** multer's answer, as the API's error shape: 413 for a file over the limit, 400 for anything else. */
function uploadError(error: unknown): AppError {
  if (error instanceof multer.MulterError) {
    if (error.code === 'LIMIT_FILE_SIZE') {
      return new AppError('file-too-large', 413, `The file is larger than ${KB} KB; a library file of .model cards is a few kB.`, [{ path: '/file', message: `is over ${KB} KB` }]);
    }
    if (error.code === 'LIMIT_UNEXPECTED_FILE' || error.code === 'LIMIT_FILE_COUNT') {
      return invalid([{ path: `/${error.field ?? MODEL_FILE_FIELD}`, message: `send one file, in the form field "${MODEL_FILE_FIELD}"` }], 'The upload has the wrong form fields.');
    }
    return invalid([{ path: '', message: `send only the file, in the form field "${MODEL_FILE_FIELD}"` }], 'The upload has the wrong form fields.');
  }
  return invalid([{ path: '', message: 'is not a readable multipart/form-data upload' }], 'The upload could not be read.');
}

const receiveModelFile: RequestHandler = (req, res, next) => {
  upload(req, res, (error?: unknown) => next(error ? uploadError(error) : undefined));
};

/** The project id of the mount path (`/api/projects/:projectId/devices`), else 404. */
const projectIdOf = (req: Request) => idParam((req.params as Record<string, string | undefined>).projectId, 'project');

const deviceIdOf = (req: Request) => idParam((req.params as Record<string, string | undefined>).deviceId, 'device-model');

/** The uploaded file, or 400 asking for it. */
function fileOf(req: Request) {
  if (!req.file) {
    throw invalid([{ path: `/${MODEL_FILE_FIELD}`, message: `attach a text file of .model cards in the form field "${MODEL_FILE_FIELD}" (multipart/form-data)` }], 'No file was uploaded.');
  }
  return { originalName: req.file.originalname, bytes: req.file.buffer };
}

export function devicesRoutes(dataSource: DataSource): Router {
  const router = Router({ mergeParams: true });
  router.use(requireSignIn);
  router.get('/', validateQuery(DEVICE_LIST_QUERY), async (req, res) => {
    res.json(await listDeviceModels(dataSource, currentUser(req), projectIdOf(req), res.locals.query as DeviceListQuery));
  });
  router.post('/', requirePermission('devices:write'), receiveModelFile, async (req, res) => {
    const projectId = projectIdOf(req);
    const items = await uploadDeviceModels(dataSource, currentUser(req), projectId, fileOf(req));
    res.status(201).json({ items });
  });
  router.get('/recorded', validateQuery(DEVICE_RECORDED_QUERY), async (req, res) => {
    res.json(await recordedDeviceModel(dataSource, currentUser(req), projectIdOf(req), res.locals.query as { name: string; checksum: string }));
  });
  router.get('/:deviceId', async (req, res) => {
    res.json(await getDeviceModel(dataSource, currentUser(req), projectIdOf(req), deviceIdOf(req)));
  });
  router.put('/:deviceId', requirePermission('devices:write'), receiveModelFile, async (req, res) => {
    const projectId = projectIdOf(req);
    const deviceId = deviceIdOf(req);
    res.json(await replaceDeviceModel(dataSource, currentUser(req), projectId, deviceId, fileOf(req)));
  });
  router.delete('/:deviceId', requirePermission('devices:write'), async (req, res) => {
    await removeDeviceModel(dataSource, currentUser(req), projectIdOf(req), deviceIdOf(req));
    res.status(204).end();
  });
  return router;
}
