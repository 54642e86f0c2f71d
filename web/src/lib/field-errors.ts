/** The server's 400/409 details, by form field: "/email" -> messages for the e-mail field. */
import { ApiError } from './api';

export type FieldErrors<F extends string> = Partial<Record<F | 'form', string>>;

/** Pattern failures say nothing useful to people ("must match pattern ..."): plain words instead. */
const PATTERN_WORDS: Record<string, string> = {
  email: 'must be an e-mail address, like name@example.com',
  displayName: 'must not be blank',
};

export function fieldErrors<F extends string>(error: unknown, fields: readonly F[]): FieldErrors<F> {
  if (!(error instanceof ApiError)) return error instanceof Error ? ({ form: error.message } as FieldErrors<F>) : {};
  const out: FieldErrors<F> = {};
  for (const detail of error.details) {
    const field = detail.path.replace(/^\//, '') as F;
    // A conflict (409: the e-mail is taken) says it best in the server's own sentence.
    const message =
      error.status === 409 ? error.message : detail.message.startsWith('must match pattern') ? (PATTERN_WORDS[field] ?? detail.message) : detail.message;
    if (fields.includes(field)) out[field] = out[field] ? `${out[field]}; ${message}` : message;
    else out.form = out.form ? `${out.form}; ${detail.path}: ${message}` : `${detail.path || 'request'}: ${message}`;
  }
  if (Object.keys(out).length === 0) out.form = error.message;
  return out;
}
