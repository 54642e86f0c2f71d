/**
 * A project's device library: `GET` lists a page of its NPN .model cards (anyone who sees the
 * project), `GET /recorded?name=&checksum=` resolves the card a spec recorded, `GET /:deviceId`
 * answers one card (retired ones included); `POST` uploads a text file of cards as
 * multipart/form-data in the field `file`, `PUT /:deviceId` replaces a card with the one card of
 * such a file, `DELETE /:deviceId` removes it (the roles with 'devices:write'). The file is held
 * in memory (at most MODEL_FILE_MAX_BYTES, api/uploads.ts) and read as text by shared/devices/model-card.ts; the
 * CSRF header applies as to every state-changing request.
 */
import { Router, type Request } from 'express';
import type { DataSource } from 'typeorm';
import { MODEL_FILE_MAX_BYTES } from '#shared/devices/model-card';
import { currentUser, requirePermission, requireSignIn } from '../auth/require';
import { getDeviceModel, listDeviceModels, recordedDeviceModel, removeDeviceModel, replaceDeviceModel, uploadDeviceModels, type DeviceListQuery } from '../services/devices.service';
import { DEVICE_LIST_QUERY, DEVICE_RECORDED_QUERY } from '../validation/bodies';
import { fileUpload } from '../uploads';
import { idParam, validateQuery } from '../validation/validate-request';

/** The multipart form field that carries the file. */
export const MODEL_FILE_FIELD = 'file';

const modelFile = fileUpload({
  field: MODEL_FILE_FIELD,
  maxBytes: MODEL_FILE_MAX_BYTES,
  what: 'a text file of .model cards',
  sizeNote: 'a library file of .model cards is a few kB',
});

/** The project id of the mount path (`/api/projects/:projectId/devices`), else 404. */
const projectIdOf = (req: Request) => idParam((req.params as Record<string, string | undefined>).projectId, 'project');

const deviceIdOf = (req: Request) => idParam((req.params as Record<string, string | undefined>).deviceId, 'device-model');

/** The uploaded file, or 400 asking for it. */
function fileOf(req: Request) {
  const { originalName, bytes } = modelFile.file(req);
  return { originalName, bytes };
}

export function devicesRoutes(dataSource: DataSource): Router {
  const router = Router({ mergeParams: true });
  router.use(requireSignIn);
  router.get('/', validateQuery(DEVICE_LIST_QUERY), async (req, res) => {
    res.json(await listDeviceModels(dataSource, currentUser(req), projectIdOf(req), res.locals.query as DeviceListQuery));
  });
  router.post('/', requirePermission('devices:write'), modelFile.receive, async (req, res) => {
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
  router.put('/:deviceId', requirePermission('devices:write'), modelFile.receive, async (req, res) => {
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
