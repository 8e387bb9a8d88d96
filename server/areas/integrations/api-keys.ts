import { and, desc, eq } from 'drizzle-orm';
import type { SessionUser } from '../../../shared/contracts/auth';
import { apiKeyScopes, type ApiKey, type ApiKeyScope, type CreateApiKeyBody } from '../../../shared/contracts/integrations';
import { permissionsToScopes, scopesToPermissions } from '../../platform/auth/api-keys';
import { apiKeyScopeOfRoute } from '../../platform/auth/api-key-scopes';
import { isAllowed, permissions } from '../../platform/auth/permissions';
import { apikey, user } from '../../platform/auth/schema';
import type { PlatformDeps } from '../../platform/deps';
import { NotFound, Unprocessable } from '../../platform/http/errors';

// API keys as the API-keys page sees them. Admins see and revoke every key; editors their own.
// A key belongs to the user who made it and can only carry scopes that open at least one
// route that user's role may call (the permission table still applies on every request).

/** The scopes a user of this role may give a key. */
export function grantableScopes(role: SessionUser['role']): ApiKeyScope[] {
  return apiKeyScopes.filter((scope) =>
    Object.entries(apiKeyScopeOfRoute).some(([routeKey, s]) => s === scope && permissions[routeKey] !== undefined && isAllowed(permissions[routeKey]!, role)),
  );
}

type Row = {
  id: string;
  name: string | null;
  start: string | null;
  permissions: string | null;
  createdAt: Date;
  expiresAt: Date | null;
  lastRequest: Date | null;
  enabled: boolean | null;
  rateLimitMax: number | null;
  rateLimitTimeWindow: number | null;
  ownerId: string;
  ownerName: string;
  ownerEmail: string;
};

const columns = {
  id: apikey.id,
  name: apikey.name,
  start: apikey.start,
  permissions: apikey.permissions,
  createdAt: apikey.createdAt,
  expiresAt: apikey.expiresAt,
  lastRequest: apikey.lastRequest,
  enabled: apikey.enabled,
  rateLimitMax: apikey.rateLimitMax,
  rateLimitTimeWindow: apikey.rateLimitTimeWindow,
  ownerId: user.id,
  ownerName: user.name,
  ownerEmail: user.email,
};

function toApiKey(r: Row, now: Date): ApiKey {
  let parsed: unknown = null;
  try {
    parsed = r.permissions ? JSON.parse(r.permissions) : null;
  } catch {
    parsed = null;
  }
  const windowMs = r.rateLimitTimeWindow ?? 60_000;
  return {
    id: r.id,
    name: r.name ?? '',
    start: r.start,
    scopes: permissionsToScopes(parsed),
    owner: { id: r.ownerId, name: r.ownerName, email: r.ownerEmail },
    createdAt: r.createdAt.toISOString(),
    expiresAt: r.expiresAt ? r.expiresAt.toISOString() : null,
    lastUsedAt: r.lastRequest ? r.lastRequest.toISOString() : null,
    ratePerMinute: Math.max(1, Math.round(((r.rateLimitMax ?? 1) * 60_000) / windowMs)),
    status: r.enabled === false ? 'revoked' : r.expiresAt && r.expiresAt.getTime() <= now.getTime() ? 'expired' : 'active',
  };
}

export function listApiKeys(deps: Pick<PlatformDeps, 'db'>, who: SessionUser): ApiKey[] {
  const q = deps.db.select(columns).from(apikey).innerJoin(user, eq(user.id, apikey.referenceId));
  const rows = (who.role === 'admin' ? q : q.where(eq(apikey.referenceId, who.id))).orderBy(desc(apikey.createdAt)).all();
  const now = new Date();
  return rows.map((r) => toApiKey(r, now));
}

function oneKey(deps: Pick<PlatformDeps, 'db'>, id: string): Row | undefined {
  return deps.db.select(columns).from(apikey).innerJoin(user, eq(user.id, apikey.referenceId)).where(eq(apikey.id, id)).get();
}

export async function createApiKey(deps: Pick<PlatformDeps, 'db' | 'auth'>, who: SessionUser, body: CreateApiKeyBody): Promise<{ apiKey: ApiKey; secret: string }> {
  const allowed = new Set(grantableScopes(who.role));
  const refused = body.scopes.filter((s) => !allowed.has(s));
  if (refused.length > 0) {
    throw new Unprocessable(`The ${who.role} role cannot give a key the scope${refused.length > 1 ? 's' : ''} ${refused.join(', ')}.`, refused.map((s) => ({ path: 'body.scopes', message: `${s} opens no route the ${who.role} role may call` })));
  }
  const created = await deps.auth.api.createApiKey({
    body: {
      userId: who.id,
      name: body.name,
      expiresIn: body.expiresInDays * 24 * 3600,
      permissions: scopesToPermissions([...new Set(body.scopes)]),
    },
  });
  const row = oneKey(deps, created.id);
  if (!row) throw new Error(`API key ${created.id} was created but cannot be read back`);
  return { apiKey: toApiKey(row, new Date()), secret: created.key };
}

/** Revoke at once: the next request with the key answers 401. Kept (disabled) so the list shows it. */
export function revokeApiKey(deps: Pick<PlatformDeps, 'db'>, who: SessionUser, id: string): ApiKey {
  const row = oneKey(deps, id);
  // another user's key is not visible to an editor: the same 404 as an unknown id
  if (!row || (who.role !== 'admin' && row.ownerId !== who.id)) throw new NotFound(`No API key ${id}.`);
  deps.db.update(apikey).set({ enabled: false, updatedAt: new Date() }).where(and(eq(apikey.id, id))).run();
  return toApiKey({ ...row, enabled: false }, new Date());
}
