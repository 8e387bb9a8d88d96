import { ApiError } from './api-client';
import { createAuthClient } from 'better-auth/react';

/**
 * better-auth's browser client, talking to /api/auth/* on the same origin. The session
 * lives in an httpOnly cookie; nothing is kept in localStorage.
 */
export const authClient = createAuthClient({
  baseURL: typeof window === 'undefined' ? 'http://localhost' : window.location.origin,
  // Look fetch up at call time (not at import), so one fetch serves the whole app and
  // tests can stub it.
  fetchOptions: { customFetchImpl: (input, init) => fetch(input, init) },
});

/**
 * The server answers /api/auth/* errors in the API's own shape, `{ error: { code, message } }`,
 * in our words (server/platform/http/auth-endpoint.ts); better-auth's client hands that body
 * back as its `error` (with `status`). This turns it into the ApiError every call throws.
 */
export function authError(error: { status?: number; error?: unknown }, fallbackCode: string, fallbackMessage: string): ApiError {
  const inner = error.error;
  const body = inner !== null && typeof inner === 'object' ? (inner as { code?: unknown; message?: unknown }) : {};
  return new ApiError(
    error.status ?? 400,
    typeof body.code === 'string' ? body.code : fallbackCode,
    typeof body.message === 'string' ? body.message : fallbackMessage,
  );
}
