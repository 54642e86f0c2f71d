/**
 * Bench measurements of a proposal's decided design: `GET` lists a page of them with their
 * comparison but without their points (anyone who sees the project), `GET /:measurementId` answers
 * one with its points, `POST` uploads one CSV as multipart/form-data in the field
 * `file`, with an optional `note` field ('measurements:write': designers and reviewers), and
 * `GET /:measurementId/file` answers the original bytes, always as a text/csv attachment that the
 * browser may not sniff into anything else, with any cell a spreadsheet would run as a formula
 * given a leading apostrophe (`spreadsheetSafeDelimited`; the figures are numbers, unchanged). The CSRF header applies as to every state-changing request.
 */
import { Router, type Request, type RequestHandler } from 'express';
import multer from 'multer';
import type { DataSource } from 'typeorm';
import { MEASUREMENT_FILE_MAX_BYTES } from '../../shared/measurements/measurement-csv';
import { MEASUREMENT_NOTE_MAX_LENGTH } from '../../shared/measurements/types';
import { spreadsheetSafeDelimited, unsafeTextMessage } from '../../shared/text/plain-text';
import { currentUser, requirePermission, requireSignIn } from '../auth/require';
import { AppError, invalid } from '../errors';
import { getMeasurement, listMeasurements, measurementFile, uploadMeasurement, type MeasurementPageQuery } from '../services/measurements.service';
import { MEASUREMENT_LIST_QUERY } from '../validation/bodies';
import { idParam, validateQuery } from '../validation/validate-request';

/** The multipart form fields: the file, and an optional note. */
export const MEASUREMENT_FILE_FIELD = 'file';
export const MEASUREMENT_NOTE_FIELD = 'note';

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MEASUREMENT_FILE_MAX_BYTES, files: 1, fields: 1, parts: 2, fieldNameSize: 100, fieldSize: MEASUREMENT_NOTE_MAX_LENGTH * 4, headerPairs: 20 },
  defParamCharset: 'utf8',
}).single(MEASUREMENT_FILE_FIELD);

const KB = MEASUREMENT_FILE_MAX_BYTES / 1024;

function uploadError(error: unknown): AppError {
  if (error instanceof multer.MulterError) {
    if (error.code === 'LIMIT_FILE_SIZE') {
      return new AppError('file-too-large', 413, `The file is larger than ${KB} KB; a measurement of up to 10,000 points is far smaller.`, [{ path: '/file', message: `is over ${KB} KB` }]);
    }
    if (error.code === 'LIMIT_FIELD_VALUE') return invalid([{ path: '/note', message: `is longer than ${MEASUREMENT_NOTE_MAX_LENGTH} characters` }]);
    if (error.code === 'LIMIT_UNEXPECTED_FILE' || error.code === 'LIMIT_FILE_COUNT') {
      return invalid([{ path: `/${error.field ?? MEASUREMENT_FILE_FIELD}`, message: `send one file, in the form field "${MEASUREMENT_FILE_FIELD}"` }], 'The upload has the wrong form fields.');
    }
    return invalid([{ path: '', message: `send the file in the form field "${MEASUREMENT_FILE_FIELD}" and optionally a "${MEASUREMENT_NOTE_FIELD}"` }], 'The upload has the wrong form fields.');
  }
  return invalid([{ path: '', message: 'is not a readable multipart/form-data upload' }], 'The upload could not be read.');
}

const receiveFile: RequestHandler = (req, res, next) => {
  upload(req, res, (error?: unknown) => next(error ? uploadError(error) : undefined));
};

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
    res.json(await listMeasurements(dataSource, currentUser(req), proposalIdOf(req), res.locals.query as MeasurementPageQuery));
  });
  router.post('/', requirePermission('measurements:write'), receiveFile, async (req, res) => {
    const proposalId = proposalIdOf(req);
    if (!req.file) {
      throw invalid([{ path: `/${MEASUREMENT_FILE_FIELD}`, message: `attach a CSV file in the form field "${MEASUREMENT_FILE_FIELD}" (multipart/form-data)` }], 'No file was uploaded.');
    }
    const note = noteOf(req);
    const measurement = await uploadMeasurement(dataSource, uploadsDir, currentUser(req), proposalId, { originalName: req.file.originalname, bytes: req.file.buffer }, note);
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
