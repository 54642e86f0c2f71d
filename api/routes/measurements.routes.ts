/**
 * Bench measurements of a proposal's decided design: `GET` lists a page of them with their
 * comparison but without their points (anyone who sees the project), `GET /:measurementId` answers
 * one with its points, `POST` uploads one CSV as multipart/form-data in the field
 * `file`, with an optional `note` field ('measurements:write': designers and reviewers), and
 * `GET /:measurementId/file` answers the original bytes, always as a text/csv attachment that the
 * browser may not sniff into anything else, with any cell a spreadsheet would run as a formula
 * given a leading apostrophe (`spreadsheetSafeDelimited`; the figures are numbers, unchanged). The CSRF header applies as to every state-changing request.
 */
import { Router, type Request } from 'express';
import type { DataSource } from 'typeorm';
import { MEASUREMENT_FILE_MAX_BYTES } from '#shared/measurements/measurement-csv';
import { MEASUREMENT_NOTE_MAX_LENGTH } from '#shared/measurements/types';
import { spreadsheetSafeDelimited, unsafeTextMessage } from '#shared/text/plain-text';
import { currentUser, requirePermission, requireSignIn } from '../auth/require';
import { invalid } from '../errors';
import { getMeasurement, listMeasurements, measurementFile, uploadMeasurement } from '../services/measurements.service';
import type { MeasurementListQuery } from '#shared/api/measurements';
import { MEASUREMENT_LIST_QUERY } from '../validation/bodies';
import { fileUpload } from '../uploads';
import { idParam, validateQuery } from '../validation/validate-request';

/** The multipart form fields: the file, and an optional note. */
export const MEASUREMENT_FILE_FIELD = 'file';
export const MEASUREMENT_NOTE_FIELD = 'note';

const measurementUpload = fileUpload({
  field: MEASUREMENT_FILE_FIELD,
  maxBytes: MEASUREMENT_FILE_MAX_BYTES,
  what: 'a CSV file',
  sizeNote: 'a measurement of up to 10,000 points is far smaller',
  textFields: { names: [MEASUREMENT_NOTE_FIELD], maxLength: MEASUREMENT_NOTE_MAX_LENGTH },
});

const proposalIdOf = (req: Request) => idParam((req.params as Record<string, string | undefined>).proposalId, 'proposal');

/** The optional note: text fields only, trimmed, at most MEASUREMENT_NOTE_MAX_LENGTH characters; empty is none. */
function noteOf(req: Request): string | null {
  const body = (req.body ?? {}) as Record<string, unknown>;
  const unknown = Object.keys(body).filter((key) => key !== MEASUREMENT_NOTE_FIELD);
  if (unknown.length > 0) throw invalid(unknown.map((key) => ({ path: `/${key}`, message: 'is not a field of a measurement upload' })));
  const note = body[MEASUREMENT_NOTE_FIELD];
  if (note === undefined) return null;
  if (typeof note !== 'string') throw invalid([{ path: '/note', message: 'must be text' }]);
  const trimmed = note.trim();
  const unsafe = unsafeTextMessage(trimmed, true);
  if (unsafe) throw invalid([{ path: '/note', message: unsafe }]);
  if ([...trimmed].length > MEASUREMENT_NOTE_MAX_LENGTH) throw invalid([{ path: '/note', message: `is longer than ${MEASUREMENT_NOTE_MAX_LENGTH} characters` }]);
  return trimmed === '' ? null : trimmed;
}

export function measurementsRoutes(dataSource: DataSource, uploadsDir: string): Router {
  const router = Router({ mergeParams: true });
  router.use(requireSignIn);
  router.get('/', validateQuery(MEASUREMENT_LIST_QUERY), async (req, res) => {
    res.json(await listMeasurements(dataSource, currentUser(req), proposalIdOf(req), res.locals.query as MeasurementListQuery));
  });
  router.post('/', requirePermission('measurements:write'), measurementUpload.receive, async (req, res) => {
    const proposalId = proposalIdOf(req);
    const { originalName, bytes } = measurementUpload.file(req);
    const note = noteOf(req);
    const measurement = await uploadMeasurement(dataSource, uploadsDir, currentUser(req), proposalId, { originalName, bytes }, note);
    res.status(201).json(measurement);
  });
  router.get('/:measurementId', async (req, res) => {
    res.json(await getMeasurement(dataSource, currentUser(req), proposalIdOf(req), idParam(req.params.measurementId, 'measurement')));
  });
  router.get('/:measurementId/file', async (req, res) => {
    const { bytes, downloadName } = await measurementFile(dataSource, uploadsDir, currentUser(req), proposalIdOf(req), idParam(req.params.measurementId, 'measurement'));
    // Whatever was uploaded, it goes back as a CSV download: never rendered, never sniffed, and
    // with every cell a spreadsheet would run as a formula neutralised (figures are numbers and stay as uploaded).
    const safe = Buffer.from(spreadsheetSafeDelimited(bytes.toString('utf8')), 'utf8');
    res.set({
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="${downloadName}"`,
      'X-Content-Type-Options': 'nosniff',
      'Content-Security-Policy': "default-src 'none'; sandbox",
      'Cache-Control': 'private, no-store',
    });
    res.send(safe);
  });
  return router;
}
