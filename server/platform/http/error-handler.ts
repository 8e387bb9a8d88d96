import { isAPIError } from 'better-auth/api';
import type { ErrorRequestHandler, RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import type { ErrorBody, ErrorIssue } from '../../../shared/contracts/common';
import type { Logger } from '../log';
import { authErrorWords } from './auth-words';
import { clipDetails, clipText } from './clip';
import { HttpError } from './errors';

// The ONE error handler: every failure leaves the API as { error: { code, message, details? } }.

export function zodIssues(error: z.ZodError): ErrorIssue[] {
  return error.issues.map((i) => ({ path: i.path.map(String).join('.') || '(root)', message: i.message }));
}

/** The error body; messages and issue lists are clipped (an answer never echoes a long input). */
function body(code: string, message: string, details?: unknown): ErrorBody {
  const m = clipText(message);
  return { error: details === undefined ? { code, message: m } : { code, message: m, details: clipDetails(details) } };
}

/** A zod issue a schema marks as "well-formed but wrong" (rich text the editor cannot hold, too deep): 422, not 400. */
function isUnprocessableIssue(issue: z.core.$ZodIssue): boolean {
  return issue.code === 'custom' && (issue.params as { status?: unknown } | undefined)?.status === 422;
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
      const unprocessable = err.issues.length > 0 && err.issues.every(isUnprocessableIssue);
      res
        .status(unprocessable ? 422 : 400)
        .json(body(unprocessable ? 'unprocessable' : 'bad_request', first ? `Invalid input at ${first.path}: ${first.message}` : 'Invalid input.', issues));
      return;
    }
    if (err instanceof HttpError) {
      res.status(err.status).json(body(err.code, err.message, err.details));
      return;
    }
    // better-auth's server API (createUser, signInEmail...) called from our handlers
    if (isAPIError(err) && err.statusCode >= 400 && err.statusCode < 500) {
      // in our words, never the library's (server/platform/http/auth-words.ts)
      const words = authErrorWords(err.statusCode, typeof err.body?.code === 'string' ? err.body.code : undefined);
      res.status(err.statusCode).json(body(words.code, words.message));
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
    // a path parameter that is not valid percent-encoding (Express's decodeURIComponent)
    if (err instanceof URIError) {
      res.status(400).json(body('bad_request', 'The address is not valid percent-encoding (a % must be followed by two hex digits).', [{ path: 'params', message: 'not valid percent-encoding' }]));
      return;
    }
    // express.json() failures (body-parser errors carry status + type; a body that does not
    // decompress carries status + expose)
    const e = err as { status?: unknown; type?: unknown; message?: unknown; expose?: unknown };
    if (typeof e.status === 'number' && (typeof e.type === 'string' || e.expose === true)) {
      if (e.type === 'entity.too.large') {
        res.status(413).json(body('payload_too_large', 'The request body is too large.'));
        return;
      }
      if (e.type === 'entity.parse.failed') {
        res.status(400).json(body('bad_request', 'The request body is not valid JSON.'));
        return;
      }
      if (e.type === 'encoding.unsupported' || e.type === 'charset.unsupported') {
        res.status(415).json(body('bad_request', 'The request body must be UTF-8 JSON without a content encoding.'));
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
