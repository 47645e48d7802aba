// The one JSON 404 for unknown /api routes and the one error handler: every failure leaves the
// server as { error: { code, message, details? } }, body-parser failures as 400/413, never a 500.
import type { ErrorRequestHandler, RequestHandler, Response } from 'express';
import { z } from 'zod';
import { HttpError } from '@/server/http/errors';
import { issuesOf } from '@/server/http/validate';
import type { ErrorBody, ErrorCode } from '@/shared/api/error';

export function sendError(res: Response, status: number, code: ErrorCode, message: string, details?: unknown): void {
  const body: ErrorBody = { error: details === undefined ? { code, message } : { code, message, details } };
  res.status(status).json(body);
}

export const apiNotFound: RequestHandler = (req, res) => {
  sendError(res, 404, 'not-found', `No API route ${req.method} ${req.baseUrl}${req.path}.`);
};

/** body-parser marks its errors with a `type` and a 4xx `status`. */
type ParserError = Error & { type?: string; status?: number; expose?: boolean; limit?: number };

export function createErrorHandler(log: (msg: string, err: unknown) => void = defaultLog): ErrorRequestHandler {
  return (err: unknown, _req, res, next) => {
    if (res.headersSent) return next(err);
    if (err instanceof HttpError) return sendError(res, err.status, err.code, err.message, err.details);
    if (err instanceof z.ZodError) {
      return sendError(res, 400, 'bad-request', 'The request is not valid.', { issues: issuesOf(err, 'input') });
    }
    const p = err as ParserError;
    if (p && p.type === 'entity.parse.failed') {
      return sendError(res, 400, 'malformed-json', 'The request body is not valid JSON.');
    }
    if (p && p.type === 'entity.too.large') {
      return sendError(res, 413, 'too-large', `The request body is larger than the ${p.limit ?? 'allowed'} bytes allowed.`);
    }
    if (p && typeof p.status === 'number' && p.status >= 400 && p.status < 500) {
      // Other parser refusals (unsupported charset or encoding, aborted request) are the caller's fault.
      const status = p.status === 415 || p.status === 413 ? p.status : 400;
      return sendError(res, status, 'bad-request', p.expose && p.message ? p.message : 'The request could not be read.');
    }
    log('Unhandled error', err);
    return sendError(res, 500, 'internal', 'Something went wrong on the server. Try again; if it keeps happening, tell an admin.');
  };
}

function defaultLog(msg: string, err: unknown): void {
  console.error(`[trimwire] ${msg}:`, err);
}
