import express, { type Express } from 'express';
import { clientIpHeader } from './platform/auth/auth';
import type { AppDeps } from './app-deps';
import { authEndpoint } from './platform/http/auth-endpoint';
import { apiNotFound, errorHandler } from './platform/http/error-handler';
import { jsonDepthGuard } from './platform/http/json-depth';
import { createApiRouter, JSON_BODY_LIMIT_BYTES, type ApiRouter } from './platform/http/route';
import { allowedOrigins, sameOriginGuard } from './platform/http/same-origin';
import { securityHeaders } from './platform/http/security-headers';
import { processPulse } from './platform/request-pulse';
import { areaRoutes } from './area-routes';

/** Paths exempt from the same-origin check: checked by their own signature instead. */
export const signatureCheckedPaths = ['/api/payments/webhook', '/api/webhooks/local-receiver'];

export type CreateAppOptions = {
  /** serve the client (Vite middleware in dev, dist/client in production); after the API 404 */
  mountClient?: (app: Express) => void;
  /** JSON body limit (default 1 MB, JSON_BODY_LIMIT_BYTES) */
  jsonLimit?: string;
};

/** Build the Express app from its dependencies. No listening here (see server/index.ts). */
export function createApp(deps: AppDeps, options: CreateAppOptions = {}): Express & { api: ApiRouter } {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', false);
  // every request beats the process's pulse: background work gives way while people are here
  app.use((_req, _res, next) => {
    processPulse.beat();
    next();
  });

  // Security (SECURITY.md): headers on every answer, then no state change from another site.
  app.use(securityHeaders({ mode: deps.env.NODE_ENV === 'development' ? 'vite' : 'built', https: deps.env.PUBLIC_URL.startsWith('https://') }));
  app.use(sameOriginGuard({ origins: allowedOrigins(deps.env), exemptPaths: signatureCheckedPaths }));

  // better-auth's rate limiter keys on this header; any client-sent value is overwritten.
  app.use((req, _res, next) => {
    req.headers[clientIpHeader] = req.socket.remoteAddress ?? 'unknown';
    next();
  });
  app.use('/api', (req, res, next) => {
    if (deps.env.LOG_LEVEL === 'debug') {
      const t0 = performance.now();
      res.on('finish', () => deps.log.debug(`${req.method} ${req.originalUrl.split('?')[0]} ${res.statusCode} ${(performance.now() - t0).toFixed(1)} ms`));
    }
    res.setHeader('Cache-Control', 'no-store');
    res.setHeader('X-Content-Type-Options', 'nosniff');
    next();
  });

  // better-auth behind our door (body limit, our error words): BEFORE express.json().
  app.all('/api/auth/*splat', ...authEndpoint(deps.auth, deps.env.PUBLIC_URL));

  // The payments webhook is verified over its raw bytes: keep them (express.json then skips it).
  app.use('/api/payments/webhook', express.raw({ type: '*/*', limit: '512kb' }));
  // the local webhook receiver checks signatures over the raw bytes too
  app.use('/api/webhooks/local-receiver', express.raw({ type: '*/*', limit: '512kb' }));
  app.use(express.json({ limit: options.jsonLimit ?? JSON_BODY_LIMIT_BYTES }));
  app.use(jsonDepthGuard());

  const api = createApiRouter(deps);
  for (const register of areaRoutes) register(api, deps);
  app.use(api.express);
  app.use('/api', apiNotFound());

  options.mountClient?.(app);

  app.use(errorHandler(deps.log));
  return Object.assign(app, { api });
}
