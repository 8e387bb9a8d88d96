import { healthResponseSchema } from '../../../shared/contracts/auth';
import { appVersion } from '../app-root';
import { prepared } from '../db/statements';
import type { PlatformDeps } from '../deps';
import { route, type ApiRouter } from './route';

/** The platform's own routes: health and the API document. */
export function registerSystemRoutes(router: ApiRouter, deps: PlatformDeps) {
  const version = appVersion();

  route(router, { method: 'GET', path: '/api/health', summary: 'ok or degraded; version, database and mail details for admins', response: healthResponseSchema }, ({ maybeUser }) => {
    let database: 'ok' | 'error' = 'ok';
    try {
      prepared(deps.db.$client, 'select 1').get();
    } catch {
      database = 'error';
    }
    const status = database === 'ok' && deps.mail.lastError() === null ? ('ok' as const) : ('degraded' as const);
    // nothing internal to anyone else: the mail error names hosts and ports (and only admins
    // pay for counting the outbox: health is polled, and the outbox only grows)
    if (maybeUser?.role !== 'admin') return { status };
    const mail = database === 'ok' ? deps.mail.status() : { pending: 0, failed: 0, lastError: deps.mail.lastError() };
    return { status, version, database, mail: { transport: deps.mail.transport, ...mail } };
  });

  route(router, { method: 'GET', path: '/api/openapi.json', summary: 'This API as an OpenAPI 3.1 document' }, ({ res }) => {
    res.json(router.openapi.document(version));
  });
}
