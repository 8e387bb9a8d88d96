import { isAPIError } from 'better-auth/api';
import type { ErrorRequestHandler, RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import type { ErrorBody, ErrorIssue } from '../../../shared/contracts/common';
import type { Logger } from '../log';
import { HttpError } from './errors';

// The ONE error handler: every failure leaves the API as { error: { code, message, details? } }.

export function zodIssues(error: z.ZodError): ErrorIssue[] {
  return error.issues.map((i) => ({ path: i.path.map(String).join('.') || '(root)', message: i.message }));
}

function body(code: string, message: string, details?: unknown): ErrorBody {
  return { error: details === undefined ? { code, message } : { code, message, details } };
}

export function apiNotFound(): RequestHandler {
  return (req, res) => {
    res.status(404).json(body('not_found', `No API route ${req.method} ${req.originalUrl.split('?')[0]}.`));
  };
}

export function errorHandler(log: Logger): ErrorRequestHandler {
  return (err: unknown, req, res, next) => {
    if (res.headersSent) {
      next(err);
      return;
    }
    if (err instanceof z.ZodError) {
      const issues = zodIssues(err);
      const first = issues[0];
      res
        .status(400)
        .json(body('bad_request', first ? `Invalid input at ${first.path}: ${first.message}` : 'Invalid input.', issues));
      return;
    }
    if (err instanceof HttpError) {
      res.status(err.status).json(body(err.code, err.message, err.details));
      return;
    }
    // better-auth's server API (createUser, signInEmail...) called from our handlers
    if (isAPIError(err) && err.statusCode >= 400 && err.statusCode < 500) {
      const code = ({ 401: 'unauthorized', 403: 'forbidden', 404: 'not_found', 409: 'conflict', 422: 'unprocessable', 429: 'rate_limited' } as Record<number, string>)[err.statusCode] ?? 'bad_request';
      res.status(err.statusCode).json(body(code, err.body?.message ?? err.message));
      return;
    }
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') {
        res.status(413).json(body('payload_too_large', `The file in field "${err.field ?? 'file'}" is too large.`));
      } else {
        res.status(400).json(body('bad_request', `Upload rejected: ${err.message}${err.field ? ` (field "${err.field}")` : ''}.`));
      }
      return;
    }
    // express.json() failures (body-parser errors carry status + type)
    const e = err as { status?: unknown; type?: unknown; message?: unknown };
    if (typeof e.status === 'number' && typeof e.type === 'string') {
      if (e.type === 'entity.too.large') {
        res.status(413).json(body('payload_too_large', 'The request body is too large.'));
        return;
      }
      if (e.type === 'entity.parse.failed') {
        res.status(400).json(body('bad_request', 'The request body is not valid JSON.'));
        return;
      }
      if (e.status >= 400 && e.status < 500) {
        res.status(e.status).json(body('bad_request', 'The request could not be read.'));
        return;
      }
    }
    log.error(`unhandled error in ${req.method} ${req.originalUrl}`, err);
    res.status(500).json(body('internal', 'Something went wrong on the server; it has been logged.'));
  };
}
