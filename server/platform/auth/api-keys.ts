import { apiKey } from '@better-auth/api-key';
import { apiKeyScopeSchema, type ApiKeyScope } from '../../../shared/contracts/integrations';

// API keys for machines, through better-auth's API-key plugin (@better-auth/api-key): keys
// are random, shown once, stored as their SHA-256 hash, expire, and count their own requests
// (a per-key window: more than the limit answers 429). A request carrying
// `Authorization: Bearer <key>` is answered as the key's owner (same permission table as a
// session) limited to the key's scopes (api-key-scopes.ts). Keys are made and listed through
// our own routes (server/areas/integrations); the plugin's own HTTP endpoints are switched off.

export const apiKeyPrefix = 'sqw_';
/** the plugin's HTTP endpoints under /api/auth: off (keys are managed through /api/api-keys) */
export const apiKeyPluginPaths = ['/api-key/create', '/api-key/verify', '/api-key/get', '/api-key/update', '/api-key/delete', '/api-key/list', '/api-key/delete-all-expired-api-keys'];

export function apiKeyPlugin(ratePerMinute: number) {
  return apiKey({
    defaultPrefix: apiKeyPrefix,
    defaultKeyLength: 48,
    // sessions are never made from keys: route() checks the key itself (and its scopes)
    enableSessionForAPIKeys: false,
    rateLimit: { enabled: true, timeWindow: 60_000, maxRequests: ratePerMinute },
    keyExpiration: { minExpiresIn: 1, maxExpiresIn: 365, defaultExpiresIn: 90 * 24 * 3600 },
    startingCharactersConfig: { shouldStore: true, charactersLength: apiKeyPrefix.length + 4 },
  });
}

/** scopes as the plugin stores permissions: ['stock:read', 'editions:read'] <-> { stock: ['read'], editions: ['read'] } */
export function scopesToPermissions(scopes: readonly ApiKeyScope[]): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const s of scopes) {
    const [resource, action] = s.split(':') as [string, string];
    (out[resource] ??= []).push(action);
  }
  return out;
}

export function permissionsToScopes(permissions: unknown): ApiKeyScope[] {
  if (!permissions || typeof permissions !== 'object') return [];
  const out: ApiKeyScope[] = [];
  for (const [resource, actions] of Object.entries(permissions as Record<string, unknown>)) {
    if (!Array.isArray(actions)) continue;
    for (const a of actions) {
      const parsed = apiKeyScopeSchema.safeParse(`${resource}:${String(a)}`);
      if (parsed.success) out.push(parsed.data);
    }
  }
  return out;
}

