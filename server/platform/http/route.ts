import { fromNodeHeaders } from 'better-auth/node';
import { Router, type NextFunction, type Request, type RequestHandler, type Response } from 'express';
import { z } from 'zod';
import type { SessionUser } from '../../../shared/contracts/auth';
import { roleSchema, type Role } from '../../../shared/contracts/common';
import { bearerKey, callerOfKey } from '../auth/api-key-caller';
import { apiKeyScopeOfRoute } from '../auth/api-key-scopes';
import { isAllowed, permissions, type Access } from '../auth/permissions';
import { readSessionFast } from '../auth/session-reader';
import type { PlatformDeps } from '../deps';
import multer from 'multer';
import { BadRequest, Forbidden, HttpError, PayloadTooLarge, Unauthorized } from './errors';
import { OpenApiCollector, type OpenApiExamples } from './openapi';
import { assertRichTextFitsEditor } from './rich-text';
import { allowFraming } from './security-headers';

// THE way to add an API route. It reads the session, enforces the permission table,
// parses params/query/body with zod (bad input -> 400 with details), calls the handler,
// checks the response against its schema (outside production) and documents the route
// in /api/openapi.json. A route without an entry in server/platform/auth/permissions.ts throws
// at start-up.

declare module 'express-serve-static-core' {
  interface Request {
    /** set by route() when the request has a session */
    user?: SessionUser;
  }
}

export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export type RouteSpec<
  P extends z.ZodType | undefined,
  Q extends z.ZodType | undefined,
  B extends z.ZodType | undefined,
  R extends z.ZodType | undefined,
> = {
  method: Method;
  /** full Express path, e.g. '/api/stock/:id'; `${method} ${path}` must be in the permission table */
  path: string;
  summary: string;
  tags?: string[];
  params?: P;
  query?: Q;
  body?: B;
  /** JSON body schema of the answer; omit when the handler writes res itself (PDF, PNG) */
  response?: R;
  /** success status (default 200; 201 for creations) */
  status?: number;
  /** content type for non-JSON answers (documentation only) */
  produces?: string;
  /** run after the role check and before parsing (e.g. multer's upload.single('file')) */
  middleware?: RequestHandler[];
  /** documentation: body is multipart (set by upload routes) */
  bodyType?: 'json' | 'multipart';
  /** documentation: an example request body and answer (checked against the schemas in tests) */
  examples?: OpenApiExamples;
  /** documentation: the answer carries an ETag and may be 304 (the handler does it) */
  etag?: boolean;
  /**
   * largest request body accepted, in bytes (default JSON_BODY_LIMIT_BYTES): a larger
   * Content-Length is refused with 413 before anything is read. Upload routes set theirs.
   */
  maxBodyBytes?: number;
};

/** The JSON body limit of every route (express.json in server/app.ts reads no more). */
export const JSON_BODY_LIMIT_BYTES = 1024 * 1024;

type Infer<T> = T extends z.ZodType ? z.output<T> : undefined;
/** what a handler returns: the response schema's input (or that as JsonText), or anything JSON when there is none */
type Answer<T> = T extends z.ZodType ? z.input<T> | JsonText : unknown;

export type RouteContext<P, Q, B> = {
  req: Request;
  res: Response;
  params: P;
  query: Q;
  body: B;
  /** the signed-in user; throws Unauthorized on a public route without a session */
  readonly user: SessionUser;
  /** the signed-in user or null (for public routes) */
  maybeUser: SessionUser | null;
};

export type RouteHandler<P, Q, B, R> = (
  ctx: RouteContext<P, Q, B>,
) => Promise<R | undefined | void> | R | undefined | void;

/**
 * A handler's answer already written as JSON text (a cached page, or one a reader thread wrote):
 * sent as it is, and checked against the route's response schema outside production like any
 * other answer.
 */
export class JsonText {
  constructor(readonly text: string) {}
}

/** What register<Area>Routes(router, deps) receives. */
export type ApiRouter = {
  express: Router;
  deps: PlatformDeps;
  openapi: OpenApiCollector;
  registered: Set<string>;
};

export function createApiRouter(deps: PlatformDeps): ApiRouter {
  return { express: Router(), deps, openapi: new OpenApiCollector(), registered: new Set() };
}

function toSessionUser(u: { id: string; email: string; name: string; role?: string | null; banned?: boolean | number | null }): SessionUser | null {
  if (u.banned) return null;
  const role = roleSchema.safeParse(u.role);
  if (!role.success) return null;
  return { id: u.id, email: u.email, name: u.name, role: role.data };
}

async function readSessionUser(deps: PlatformDeps, req: Request, res: Response): Promise<SessionUser | null> {
  // the common case (a live session that needs no extension) is read straight from the database,
  // fresh on every request; anything else is better-auth's (server/platform/auth/session-reader.ts)
  const fast = await readSessionFast(deps.auth, deps.db, req.headers.cookie);
  if (fast.kind === 'none') return null;
  if (fast.kind === 'session') return toSessionUser(fast.user);
  const { headers, response: session } = await deps.auth.api.getSession({ headers: fromNodeHeaders(req.headers), returnHeaders: true });
  // a session past its update age is extended: pass the refreshed cookie on
  for (const cookie of headers.getSetCookie()) res.append('Set-Cookie', cookie);
  if (!session) return null;
  return toSessionUser(session.user as { id: string; email: string; name: string; role?: string | null; banned?: boolean | null });
}

function parsePart<T extends z.ZodType>(schema: T, value: unknown, where: 'params' | 'query' | 'body'): z.output<T> {
  const result = schema.safeParse(value);
  if (!result.success) {
    throw new z.ZodError(result.error.issues.map((i) => ({ ...i, path: [where, ...i.path] })));
  }
  return result.data;
}

export function route<
  P extends z.ZodType | undefined = undefined,
  Q extends z.ZodType | undefined = undefined,
  B extends z.ZodType | undefined = undefined,
  R extends z.ZodType | undefined = undefined,
>(
  router: ApiRouter,
  spec: RouteSpec<P, Q, B, R>,
  handler: RouteHandler<Infer<P>, Infer<Q>, Infer<B>, Answer<R>>,
): void {
  const key = `${spec.method} ${spec.path}`;
  const access: Access | undefined = permissions[key];
  if (access === undefined) {
    throw new Error(`route ${key} has no entry in server/platform/auth/permissions.ts (add '${key}': [...roles])`);
  }
  if (router.registered.has(key)) throw new Error(`route ${key} is registered twice`);
  router.registered.add(key);
  router.openapi.add({
    method: spec.method,
    path: spec.path,
    summary: spec.summary,
    access,
    ...(apiKeyScopeOfRoute[key] ? { scope: apiKeyScopeOfRoute[key] } : {}),
    ...(spec.examples ? { examples: spec.examples } : {}),
    ...(spec.etag ? { etag: true } : {}),
    ...(spec.tags ? { tags: spec.tags } : {}),
    ...(spec.params ? { params: spec.params } : {}),
    ...(spec.query ? { query: spec.query } : {}),
    ...(spec.body ? { body: spec.body } : {}),
    ...(spec.response ? { response: spec.response } : {}),
    ...(spec.status ? { status: spec.status } : {}),
    ...(spec.produces ? { produces: spec.produces } : {}),
    ...(spec.bodyType ? { bodyType: spec.bodyType } : {}),
  });
  const { deps } = router;
  const checkResponses = deps.env.NODE_ENV !== 'production';

  const maxBody = spec.maxBodyBytes ?? JSON_BODY_LIMIT_BYTES;
  const isPdf = spec.produces === 'application/pdf';

  const guard: RequestHandler = async (req, res, next) => {
    try {
      const length = Number(req.headers['content-length']);
      if (Number.isFinite(length) && length > maxBody) {
        throw new PayloadTooLarge(`The request body is too large: ${key} takes at most ${maxBody} bytes.`, [{ path: 'body', message: `more than ${maxBody} bytes` }]);
      }
      // our pages show our PDFs in an <iframe>: those (only) may be framed by our own origin
      if (isPdf) allowFraming(res, ["'self'"]);
      // a machine: `Authorization: Bearer <key>` is the only credential read (never the cookie
      // beside it); the key's owner passes the same permission table, within the key's scopes
      const bearer = access === 'public' ? null : bearerKey(req);
      if (bearer !== null) {
        const caller = await callerOfKey(deps.auth, deps.db, bearer, res);
        const scope = apiKeyScopeOfRoute[key];
        if (!scope || !caller.scopes.includes(scope)) {
          throw new Forbidden(scope ? `This API key lacks the scope ${scope} that ${key} needs.` : `${key} cannot be called with an API key.`, [{ path: 'headers.authorization', message: scope ? `needs scope ${scope}` : 'sessions only' }]);
        }
        req.user = caller.user;
      }
      const user = bearer !== null ? (req.user ?? null) : access === 'public' ? await readSessionUser(deps, req, res).catch(() => null) : await readSessionUser(deps, req, res);
      if (user) req.user = user;
      if (!isAllowed(access, (user?.role ?? null) as Role | null)) {
        throw user ? new Forbidden(`The ${user.role} role may not call ${key}.`) : new Unauthorized();
      }
      next();
    } catch (err) {
      next(err);
    }
  };

  const main = async (req: Request, res: Response, next: NextFunction) => {
    try {
      const params = spec.params ? parsePart(spec.params, req.params, 'params') : undefined;
      const query = spec.query ? parsePart(spec.query, req.query, 'query') : undefined;
      const body = spec.body ? parsePart(spec.body, req.body ?? {}, 'body') : undefined;
      if (spec.body) assertRichTextFitsEditor(body);
      const maybeUser = req.user ?? null;
      const ctx: RouteContext<Infer<P>, Infer<Q>, Infer<B>> = {
        req,
        res,
        params: params as Infer<P>,
        query: query as Infer<Q>,
        body: body as Infer<B>,
        maybeUser,
        get user() {
          if (!maybeUser) throw new Unauthorized();
          return maybeUser;
        },
      };
      const result = await handler(ctx);
      if (res.headersSent) return;
      if (result === undefined) {
        res.status(spec.status ?? 204).end();
        return;
      }
      const text = result instanceof JsonText ? result.text : null;
      if (spec.response && checkResponses) {
        const check = spec.response.safeParse(text !== null ? JSON.parse(text) : result);
        if (!check.success) {
          throw new Error(`response of ${key} does not match its schema: ${z.prettifyError(check.error)}`);
        }
      }
      if (text !== null) res.status(spec.status ?? 200).type('application/json').send(text);
      else res.status(spec.status ?? 200).json(result);
    } catch (err) {
      next(err);
    }
  };

  // a multipart body that cannot be read (truncated, no boundary, a bad part header) is the
  // caller's mistake: 400 with busboy's reason, never a 500
  const middleware = (spec.middleware ?? []).map((m): RequestHandler =>
    spec.bodyType === 'multipart'
      ? (req, res, next) =>
          m(req, res, (err?: unknown) => {
            if (err === undefined || err === null || err === 'route' || err === 'router') next(err as undefined);
            else if (err instanceof HttpError || err instanceof multer.MulterError) next(err);
            else next(new BadRequest(`The upload could not be read: ${err instanceof Error ? err.message : String(err)}. Send multipart/form-data with its boundary and complete parts.`, [{ path: 'body', message: 'not readable as multipart/form-data' }]));
          })
      : m,
  );

  const method = spec.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  router.express[method](spec.path, guard, ...middleware, main);
}
