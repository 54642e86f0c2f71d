/**
 * The one upload middleware: a multipart/form-data body with one file, held in memory (multer),
 * with its limits as parameters and one shape of error answer for every upload route (device
 * library files, bench measurements, spec imports). Whether the file is really text is the
 * readers' check (`shared/text/upload-text.ts`), never this one's.
 *
 * The answers, the API's error shape (`api/errors.ts`), paths as JSON pointers into the form:
 * - a file over the limit: 413 `file-too-large`, `/<field>` "is over 256 KB";
 * - another file field, or more than one file: 400, `/<that field>` "send one file, in the form
 *   field …";
 * - a text field longer than allowed: 400, `/<that field>` "is longer than N characters";
 * - too many or unknown fields or parts: 400, `` "send only the file, …" (what may be sent);
 * - a body that is not readable multipart: 400, `` "is not a readable multipart/form-data upload";
 * - no file at all (`uploadedFile`): 400, `/<field>` "attach … in the form field …".
 */
import type { Request, RequestHandler } from 'express';
import multer from 'multer';
import { AppError, invalid } from './errors';
import { describeCheck } from './validation/validate-request';

/** Text fields sent beside the file: by name (each optional, at most `maxLength` characters), or only a number of them. */
export type UploadTextFields = { names: readonly string[]; maxLength: number } | { count: number };

export interface UploadOptions {
  /** The form field of the file. */
  field: string;
  /** Largest file, bytes. */
  maxBytes: number;
  /** What the file is, as the missing-file answer asks for it: "a CSV file". */
  what: string;
  /** Why the limit is ample, after the 413 message's limit: "a library file of .model cards is a few kB". */
  sizeNote: string;
  /** Text fields accepted beside the file; none when absent. */
  textFields?: UploadTextFields;
}

/** The uploaded file as the services take it. */
export interface UploadedFile {
  originalName: string;
  bytes: Buffer;
  mimeType: string;
}

export interface FileUpload {
  /** Parses the body into `req.file` (and text fields into `req.body`); its refusals answer as above. */
  receive: RequestHandler;
  /** The uploaded file, or the 400 asking for it. */
  file(req: Request): UploadedFile;
}

/** "256 KB", "1 MB": a limit as its answers print it (1 KB = 1024 bytes). */
export function sizeText(bytes: number): string {
  return bytes % (1024 * 1024) === 0 ? `${bytes / (1024 * 1024)} MB` : `${bytes / 1024} KB`;
}

/** The one upload middleware factory (see above). */
export function fileUpload(options: UploadOptions): FileUpload {
  const { field, maxBytes, textFields } = options;
  const fieldCount = textFields === undefined ? 0 : 'names' in textFields ? textFields.names.length : textFields.count;
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: {
      fileSize: maxBytes,
      files: 1,
      fields: fieldCount,
      parts: fieldCount + 1,
      fieldNameSize: 100,
      // A character is at most 4 bytes of UTF-8; the exact count is the route's check.
      ...(textFields && 'names' in textFields ? { fieldSize: textFields.maxLength * 4 } : {}),
      headerPairs: 20,
    },
    // Browsers send file names as UTF-8 bytes.
    defParamCharset: 'utf8',
  }).single(field);

  const size = sizeText(maxBytes);
  const onlyHint =
    fieldCount === 0
      ? `send only the file, in the form field "${field}"`
      : textFields && 'names' in textFields
        ? `send the file in the form field "${field}" and optionally ${textFields.names.map((name) => `a "${name}"`).join(', ')}`
        : `send the file in the form field "${field}" and at most ${fieldCount} other fields`;

  function refusal(error: unknown): AppError {
    if (error instanceof multer.MulterError) {
      if (error.code === 'LIMIT_FILE_SIZE') {
        return new AppError('file-too-large', 413, `The file is larger than ${size}; ${options.sizeNote}.`, [{ path: `/${field}`, message: `is over ${size}` }]);
      }
      if (error.code === 'LIMIT_FIELD_VALUE' && textFields && 'names' in textFields) {
        return invalid([{ path: `/${error.field ?? ''}`, message: `is longer than ${textFields.maxLength} characters` }]);
      }
      if (error.code === 'LIMIT_UNEXPECTED_FILE' || error.code === 'LIMIT_FILE_COUNT') {
        return invalid([{ path: `/${error.field ?? field}`, message: `send one file, in the form field "${field}"` }], 'The upload has the wrong form fields.');
      }
      return invalid([{ path: '', message: onlyHint }], 'The upload has the wrong form fields.');
    }
    return invalid([{ path: '', message: 'is not a readable multipart/form-data upload' }], 'The upload could not be read.');
  }

  const receive: RequestHandler = (req, res, next) => {
    upload(req, res, (error?: unknown) => next(error ? refusal(error) : undefined));
  };
  const textNames = textFields && 'names' in textFields ? textFields.names : [];
  describeCheck(receive, {
    part: 'multipart',
    schema: {
      type: 'object',
      required: [field],
      properties: {
        [field]: { type: 'string', contentMediaType: 'application/octet-stream', description: `${options.what}, at most ${size}` },
        ...Object.fromEntries(textNames.map((name) => [name, { type: 'string', ...(textFields && 'maxLength' in textFields ? { maxLength: textFields.maxLength } : {}) }])),
      },
    },
  });
  return {
    receive,
    file(req) {
      if (!req.file) {
        throw invalid([{ path: `/${field}`, message: `attach ${options.what} in the form field "${field}" (multipart/form-data)` }], 'No file was uploaded.');
      }
      return { originalName: req.file.originalname, bytes: req.file.buffer, mimeType: req.file.mimetype };
    },
  };
}
