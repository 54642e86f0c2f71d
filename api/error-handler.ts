/**
 * The one error middleware: an AppError answers with its status and details; a body too large
 * answers 413, malformed JSON 400, a path parameter with a malformed percent-escape 400;
 * anything else is a generic 500, its stack logged only.
 */
import type { ErrorRequestHandler } from 'express';
import { AppError } from './errors';

interface HttpishError {
  type?: string;
  status?: number;
  expose?: boolean;
}

export function errorHandler(log: (message: string) => void = (m) => console.error(m)): ErrorRequestHandler {
  return (error, _req, res, _next) => {
    if (error instanceof AppError) {
      res.set(error.headers);
      res.status(error.status).json({ error: error.message, code: error.code, details: error.details });
      return;
    }
    const http = error as HttpishError;
    if (http.type === 'entity.too.large') {
      res.status(413).json({ error: 'The request body is too large.', code: 'body-too-large', details: [{ path: '', message: 'is over the size limit' }] });
      return;
    }
    if (http.type === 'entity.parse.failed') {
      res.status(400).json({ error: 'The request body is not valid JSON.', code: 'malformed-json', details: [{ path: '', message: 'is not valid JSON' }] });
      return;
    }
    // Express's router could not percent-decode a path parameter ("%E0%A4%A", "%zz"): the client's address is wrong
    if (error instanceof URIError && http.status === 400) {
      res.status(400).json({ error: 'The address has a malformed percent-escape.', code: 'malformed-url', details: [{ path: '', message: 'a "%" in the address must be followed by two hexadecimal digits that spell UTF-8' }] });
      return;
    }
    if (http.expose && typeof http.status === 'number' && http.status >= 400 && http.status < 500) {
      res.status(http.status).json({ error: 'The request could not be read.', code: 'bad-request', details: [{ path: '', message: String((error as Error).message ?? '') }] });
      return;
    }
    log(`Unexpected error: ${(error as Error)?.stack ?? String(error)}`);
    res.status(500).json({ error: 'Something went wrong on the server; nothing was changed by this request.', code: 'internal-error', details: [] });
  };
}
