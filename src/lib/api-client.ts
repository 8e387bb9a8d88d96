import { z } from 'zod';

/**
 * The error every API call throws: the server's `{ error: { code, message, details? } }`
 * envelope, or a client-side code (`network_error`, `bad_response`) when there was none.
 * Pure: no toasts, no redirects; the UI decides what to do with it.
 */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown;

  constructor(status: number, code: string, message: string, details?: unknown) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }
}

const errorEnvelopeSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.unknown().optional(),
  }),
});

export type QueryValue = string | number | boolean | null | undefined;

export interface ApiRequestOptions<T> {
  /** Schema the response body is parsed with; the result is typed by it. */
  schema: z.ZodType<T>;
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  /** JSON body (or FormData for uploads). */
  body?: unknown;
  /** Query string; undefined, null and '' entries are left out. */
  query?: Record<string, QueryValue>;
  signal?: AbortSignal;
}

/** Builds `/api/...?a=1` from a path and a query object, skipping empty values. */
export function buildUrl(path: string, query?: Record<string, QueryValue>): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query ?? {})) {
    if (value === undefined || value === null || value === '') continue;
    params.set(key, String(value));
  }
  const qs = params.toString();
  return qs ? `${path}?${qs}` : path;
}

/**
 * Calls the API and parses the JSON answer with `schema`. Throws ApiError for a
 * non-2xx status (using the server's error envelope), a network failure, or a body
 * that does not match the schema.
 */
export async function apiRequest<T>(path: string, options: ApiRequestOptions<T>): Promise<T> {
  const { schema, method = 'GET', body, query, signal } = options;
  const headers: Record<string, string> = { accept: 'application/json' };
  let payload: BodyInit | undefined;
  if (body instanceof FormData) payload = body;
  else if (body !== undefined) {
    headers['content-type'] = 'application/json';
    payload = JSON.stringify(body);
  }
  let response: Response;
  try {
    response = await fetch(buildUrl(path, query), {
      method,
      headers,
      body: payload,
      credentials: 'same-origin',
      signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(0, 'network_error', 'The server could not be reached. Check your connection and try again.');
  }
  const text = await response.text();
  let json: unknown = undefined;
  if (text) {
    try {
      json = JSON.parse(text);
    } catch {
      json = undefined;
    }
  }
  if (!response.ok) {
    const envelope = errorEnvelopeSchema.safeParse(json);
    if (envelope.success) {
      const { code, message, details } = envelope.data.error;
      throw new ApiError(response.status, code, message, details);
    }
    throw new ApiError(response.status, `http_${response.status}`, `The server answered ${response.status} ${response.statusText}`.trim());
  }
  const parsed = schema.safeParse(json);
  if (!parsed.success) {
    throw new ApiError(response.status, 'bad_response', `Unexpected answer from ${path}: ${z.prettifyError(parsed.error)}`, parsed.error.issues);
  }
  return parsed.data;
}

/** True for an ApiError with the given HTTP status. */
export function isApiError(error: unknown, status?: number): error is ApiError {
  return error instanceof ApiError && (status === undefined || error.status === status);
}

/** A message fit to show a person, whatever was thrown. */
export function errorMessage(error: unknown): string {
  if (error instanceof Error) return error.message;
  return 'Something went wrong.';
}
