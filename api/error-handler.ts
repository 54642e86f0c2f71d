/**
 * The one error middleware: an AppError answers with its status and details; a body too large
 * answers 413, malformed JSON 400; anything else is a generic 500, its stack logged only.
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
    if (http.expose && typeof http.status === 'number' && http.status >= 400 && http.status < 500) {
      res.status(http.status).json({ error: 'The request could not be read.', code: 'bad-request', details: [{ path: '', message: String((error as Error).message ?? '') }] });
      return;
    }
    log(`Unexpected error: ${(error as Error)?.stack ?? String(error)}`);
    res.status(500).json({ error: 'Something went wrong on the server; nothing was changed by this request.', code: 'internal-error', details: [] });
  };
}
