import { sql } from 'drizzle-orm';
import { healthResponseSchema } from '../../../shared/contracts/auth';
import { appVersion } from '../app-root';
import type { PlatformDeps } from '../deps';
import { route, type ApiRouter } from './route';

/** The platform's own routes: health and the API document. */
export function registerSystemRoutes(router: ApiRouter, deps: PlatformDeps) {
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

  route(router, { method: 'GET', path: '/api/openapi.json', summary: 'This API as an OpenAPI 3.1 document' }, ({ res }) => {
    res.json(router.openapi.document(version));
  });
}
