import type { ErrorCode } from '../../../shared/contracts/common';

// Domain errors. Throw these from services and handlers; the one error handler in
// server/platform/http/error-handler.ts turns them into `{ error: { code, message, details? } }`.

export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = new.target.name;
  }
}

/** 400: input that a zod schema could not catch (use zod where you can). */
export class BadRequest extends HttpError {
  constructor(message: string, details?: unknown) {
    super(400, 'bad_request', message, details);
  }
}
/** 401: no session. */
export class Unauthorized extends HttpError {
  constructor(message = 'Sign in first.') {
    super(401, 'unauthorized', message);
  }
}
/** 403: signed in, but this role may not do this (or not to this object). */
export class Forbidden extends HttpError {
  constructor(message = 'Your role may not do this.', details?: unknown) {
    super(403, 'forbidden', message, details);
  }
}
/** 404: no such object (or not visible to this user). */
export class NotFound extends HttpError {
  constructor(message = 'Not found.', details?: unknown) {
    super(404, 'not_found', message, details);
  }
}
/** 409: the state does not allow it (duplicate, wrong edition state, already used...). */
export class Conflict extends HttpError {
  constructor(message: string, details?: unknown) {
    super(409, 'conflict', message, details);
  }
}
/** 413: upload too large. */
export class PayloadTooLarge extends HttpError {
  constructor(message = 'The upload is too large.', details?: unknown) {
    super(413, 'payload_too_large', message, details);
  }
}
/** 422: well-formed but wrong (a tiling that does not close, a puzzle that is not unique...). */
export class Unprocessable extends HttpError {
  constructor(message: string, details?: unknown) {
    super(422, 'unprocessable', message, details);
  }
}
