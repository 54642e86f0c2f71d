/**
 * Request validation middleware: the body (or query) checked against a JSON Schema with the
 * shared ajv instance; a 400 with every problem's JSON path, or the validated copy put back.
 */
import type { RequestHandler } from 'express';
import { compileValidator, type ValidationResult } from '#shared/validate';
import { invalid, notFound } from '../errors';

/**
 * What a validating middleware checks, kept for the API description (api/openapi.ts): the JSON
 * body, the query, or a multipart upload (api/uploads.ts), and its JSON Schema.
 */
export interface CheckedPart {
  part: 'body' | 'query' | 'multipart';
  schema: object;
}
const CHECKED = new WeakMap<RequestHandler, CheckedPart>();

/** Records what `handler` checks (the two validators below and the upload middleware call this). */
export function describeCheck(handler: RequestHandler, checked: CheckedPart): RequestHandler {
  CHECKED.set(handler, checked);
  return handler;
}

/** The body or query schema a middleware of a route checks against, if it is one of the two below. */
export const checkedPart = (handler: unknown): CheckedPart | undefined => CHECKED.get(handler as RequestHandler);

/**
 * Validates `req.body` against a JSON Schema, or with a ready validator (validateDesign, which
 * adds the cross-field rules; `described` is then the JSON Schema it starts from, for the API
 * description); non-JSON bodies (wrong content type, bare values) are refused too.
 */
export function validateBody(schema: object | ((input: unknown) => ValidationResult<unknown>), described?: object): RequestHandler {
  const check = typeof schema === 'function' ? schema : compileValidator<unknown>(schema);
  const handler: RequestHandler = (req, _res, next) => {
    if (!req.is('application/json')) return next(invalid([{ path: '', message: 'must be JSON (Content-Type: application/json)' }]));
    const result = check(req.body);
    if (!result.ok) return next(invalid(result.errors));
    req.body = result.value;
    next();
  };
  const documented = typeof schema === 'function' ? described : schema;
  return documented ? describeCheck(handler, { part: 'body', schema: documented }) : handler;
}

/**
 * Query strings arrive as text: numeric-looking values of the fields the schema types as numbers
 * are turned into numbers before the check; text fields stay text ("0123", a name of digits).
 */
function coerceQuery(query: Record<string, unknown>, numeric: ReadonlySet<string>): Record<string, unknown> {
  return Object.fromEntries(Object.entries(query).map(([k, v]) => [k, numeric.has(k) && typeof v === 'string' && /^-?\d+(\.\d+)?$/.test(v) ? Number(v) : v]));
}

/** The query schema's fields typed integer or number. */
function numericFields(schema: object): Set<string> {
  const properties = (schema as { properties?: Record<string, { type?: unknown }> }).properties ?? {};
  return new Set(Object.entries(properties).filter(([, field]) => field.type === 'integer' || field.type === 'number').map(([key]) => key));
}

/** Validates the query string; the checked copy is left in `res.locals.query`. */
export function validateQuery(schema: object): RequestHandler {
  const check = compileValidator<unknown>(schema);
  const numeric = numericFields(schema);
  const handler: RequestHandler = (req, res, next) => {
    const result = check(coerceQuery(req.query as Record<string, unknown>, numeric));
    if (!result.ok) return next(invalid(result.errors.map((e) => ({ ...e, path: `?${e.path.replace(/^\//, '')}` }))));
    res.locals.query = result.value;
    next();
  };
  return describeCheck(handler, { part: 'query', schema });
}

/** A positive integer route parameter, else 404 (a malformed id names no record). */
export function idParam(value: string | string[] | undefined, what: string): number {
  const id = Number(value);
  if (typeof value !== 'string' || !Number.isInteger(id) || id < 1 || String(id) !== value) throw notFound(what);
  return id;
}
