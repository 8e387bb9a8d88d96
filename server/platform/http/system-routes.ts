import { sql } from 'drizzle-orm';
import {
  healthResponseSchema,
  meResponseSchema,
  publicConfigResponseSchema,
  requestPasswordResetBodySchema,
  resetPasswordBodySchema,
  signInBodySchema,
} from '../../../shared/contracts/auth';
import { appVersion } from '../app-root';
import { demoAccounts, demoPassword } from '../../areas/accounts/demo-accounts';
import type { AppDeps } from '../deps';
import { route, type ApiRouter } from './route';

export function registerFoundationRoutes(router: ApiRouter, deps: AppDeps) {
  const version = appVersion();

  route(router, { method: 'GET', path: '/api/health', summary: 'Version, database and mail status', response: healthResponseSchema }, () => {
    let database: 'ok' | 'error' = 'ok';
    try {
      deps.db.get(sql`select 1`);
    } catch {
      database = 'error';
    }
    const mail = database === 'ok' ? deps.mail.status() : { pending: 0, failed: 0, lastError: null };
    return { version, database, mail: { transport: deps.mail.transport, ...mail } };
  });

  route(router, { method: 'GET', path: '/api/public/config', summary: 'Public settings for the sign-in page', response: publicConfigResponseSchema }, () =>
    deps.demo
      ? { demo: true, demoAccounts: demoAccounts.map(({ email, role }) => ({ email, role })), demoPassword }
      : { demo: false },
  );

  route(router, { method: 'GET', path: '/api/me', summary: 'The signed-in user', response: meResponseSchema }, ({ user }) => ({ user }));

  // better-auth's endpoints the client uses (served by better-auth, documented here)
  const authDoc = (path: string, summary: string, body?: typeof signInBodySchema | typeof requestPasswordResetBodySchema | typeof resetPasswordBodySchema) =>
    router.openapi.add({ method: 'POST', path, summary, tags: ['auth'], access: 'public (better-auth)', ...(body ? { body } : {}) });
  authDoc('/api/auth/sign-in/email', 'Sign in with e-mail and password (sets the session cookie; rate-limited)', signInBodySchema);
  authDoc('/api/auth/sign-out', 'Sign out (ends the session)');
  authDoc('/api/auth/request-password-reset', 'Mail a password-reset link', requestPasswordResetBodySchema);
  authDoc('/api/auth/reset-password', 'Set a new password with the token from the mail', resetPasswordBodySchema);

  route(router, { method: 'GET', path: '/api/openapi.json', summary: 'This API as an OpenAPI 3.1 document' }, ({ res }) => {
    res.json(router.openapi.document(version));
  });
}
