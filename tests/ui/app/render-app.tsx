import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { vi } from 'vitest';
import { buildRoutes } from '../../../src/app/router';
import type { Role } from '../../../src/lib/roles';

// Test helpers for the client: a stubbed fetch answering by method and path, and the
// whole app in a memory router on a fresh QueryClient (retry: false).

export type FetchCall = { method: string; path: string; body: unknown };
export type Handler = (call: FetchCall) => { status?: number; body?: unknown } | Promise<{ status?: number; body?: unknown }>;

/**
 * Stubs global fetch: `routes` maps 'GET /api/me' to a handler or a fixed answer.
 * Anything not listed answers 404 with our error envelope, and is recorded in `calls`.
 */
export function stubFetch(routes: Record<string, Handler | { status?: number; body?: unknown }>) {
  const calls: FetchCall[] = [];
  const fetchStub = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const request = input instanceof Request ? input : undefined;
    const url = new URL(request ? request.url : String(input), 'http://localhost:3000');
    const method = (init?.method ?? request?.method ?? 'GET').toUpperCase();
    let body: unknown = undefined;
    const raw = init?.body ?? (request ? await request.clone().text() : undefined);
    if (typeof raw === 'string' && raw) {
      try {
        body = JSON.parse(raw);
      } catch {
        body = raw;
      }
    }
    const call = { method, path: url.pathname, body };
    calls.push(call);
    const key = `${method} ${url.pathname}`;
    // The app asks GET /api/session ({ user } or { user: null }, never 401); tests keep stubbing
    // it as 'GET /api/me' (meAs / noSession), read here the way the server answers /api/session.
    const route = routes[key] ?? (key === 'GET /api/session' ? sessionFromMe(routes['GET /api/me']) : undefined);
    const answer = typeof route === 'function' ? await route(call) : route;
    const status = answer?.status ?? (answer ? 200 : 404);
    const payload = answer ? answer.body : { error: { code: 'not_found', message: `no stub for ${method} ${url.pathname}` } };
    return new Response(payload === undefined ? null : JSON.stringify(payload), {
      status,
      headers: { 'content-type': 'application/json' },
    });
  });
  vi.stubGlobal('fetch', fetchStub);
  return { calls, fetchStub };
}

/** GET /api/session from a 'GET /api/me' stub: its user, or { user: null } where /api/me says 401. */
function sessionFromMe(me: Handler | { status?: number; body?: unknown } | undefined): Handler | undefined {
  if (!me) return undefined;
  return async (call) => {
    const answer = typeof me === 'function' ? await me(call) : me;
    return answer.status === 401 ? { body: { user: null } } : answer;
  };
}

/** A session user of the given role, as GET /api/me (and GET /api/session) answer. */
export function meAs(role: Role) {
  return { body: { user: { id: `u-${role}`, email: `${role}@demo.squarewright.test`, name: `Demo ${role}`, role } } };
}

export const noSession = { status: 401, body: { error: { code: 'unauthorized', message: 'Sign in first' } } };

/** Renders the whole app (all routes) at `path` on a fresh QueryClient with retries off. */
export function renderApp(path: string) {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  const router = createMemoryRouter(buildRoutes(queryClient), { initialEntries: [path] });
  const utils = render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return { ...utils, router, queryClient };
}
