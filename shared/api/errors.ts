/**
 * The error answer of every route (api/errors.ts throws it, api/error-handler.ts writes it, the
 * web's ApiError reads it): `{ error, code, details }` with the HTTP status.
 */

/** One problem of a request, located by JSON path (`/supply/negativeV`, `?page` for the query). */
export interface ErrorDetail {
  path: string;
  message: string;
  /** 1-based line of an uploaded text file the problem is on (device library uploads). */
  line?: number;
}

/** The body of a non-2xx answer. */
export interface ErrorBody {
  /** The message for people. */
  error: string;
  /** Stable, for programs: `invalid-request`, `spec-not-found`, `forbidden`... */
  code: string;
  details: ErrorDetail[];
}
