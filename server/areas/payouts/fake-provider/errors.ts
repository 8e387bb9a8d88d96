// The provider's error answers: a status and the `{ error: { type, code, message, param } }`
// envelope the SDK turns into its error classes (400 -> StripeInvalidRequestError, 401 ->
// StripeAuthenticationError, an idempotency_error -> StripeIdempotencyError, 500 -> StripeAPIError).

export class FakeError extends Error {
  constructor(
    readonly status: number,
    readonly type: 'invalid_request_error' | 'idempotency_error' | 'api_error',
    readonly code: string,
    message: string,
    readonly param?: string,
  ) {
    super(message);
    this.name = 'FakeError';
  }
}

/** A 400 invalid_request_error, the provider's answer to a request it will not do. */
export function invalidRequest(code: string, message: string, param?: string): FakeError {
  return new FakeError(400, 'invalid_request_error', code, message, param);
}

/** A 404 for an object the fake does not have. */
export function noSuch(what: string, id: string, param: string): FakeError {
  return new FakeError(404, 'invalid_request_error', 'resource_missing', `No such ${what}: '${id}'`, param);
}

/** Any thrown value as the provider would answer it: a FakeError as itself, anything else as a 500. */
export function asFakeError(error: unknown): FakeError {
  if (error instanceof FakeError) return error;
  return new FakeError(500, 'api_error', 'fake_internal', error instanceof Error ? error.message : String(error));
}

/** The JSON body of an error answer. */
export function errorBody(error: FakeError): string {
  return JSON.stringify({ error: { type: error.type, code: error.code, message: error.message, ...(error.param ? { param: error.param } : {}) } });
}
