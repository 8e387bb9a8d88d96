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
