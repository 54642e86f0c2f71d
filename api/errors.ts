/**
 * The one error type of the server. Throw it anywhere; the error middleware answers
 * `{ error, code, details: [{ path, message, line? }] }` with its status. Anything else is a generic 500.
 */
import type { ErrorDetail } from '#shared/api/errors';

export type { ErrorDetail };

export class AppError extends Error {
  readonly code: string;
  readonly status: number;
  readonly details: ErrorDetail[];
  /** Response headers the answer carries (e.g. Retry-After on a 429). */
  headers: Record<string, string> = {};

  constructor(code: string, status: number, message: string, details: ErrorDetail[] = []) {
    super(message);
    this.name = 'AppError';
    this.code = code;
    this.status = status;
    this.details = details;
  }
}

export const notFound = (what: string) => new AppError(`${what}-not-found`, 404, `No such ${what.replace(/-/g, ' ')}.`);
export const forbidden = (message = 'Your role does not allow this.') => new AppError('forbidden', 403, message);
export const invalid = (details: ErrorDetail[], message = 'The request is not valid.') => new AppError('invalid-request', 400, message, details);
export const conflict = (code: string, message: string) => new AppError(code, 409, message);
