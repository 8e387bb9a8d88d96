import { eq } from 'drizzle-orm';
import type { Request, Response } from 'express';
import type { SessionUser } from '../../../shared/contracts/auth';
import { roleSchema } from '../../../shared/contracts/common';
import type { ApiKeyScope } from '../../../shared/contracts/integrations';
import type { Db } from '../db/client';
import { HttpError, Unauthorized } from '../http/errors';
import { permissionsToScopes } from './api-keys';
import type { Auth } from './auth';
import { user } from './schema';

// Who calls with `Authorization: Bearer <key>` (read by route(); see api-keys.ts).

/** The key in `Authorization: Bearer <key>`, or null when the header is absent or not a bearer token. */
export function bearerKey(req: Request): string | null {
  const h = req.headers.authorization;
  if (typeof h !== 'string') return null;
  const m = /^Bearer\s+(\S+)\s*$/i.exec(h);
  return m ? m[1]! : null;
}

export type ApiKeyCaller = { user: SessionUser; keyId: string; scopes: ApiKeyScope[] };

/**
 * The caller behind a key: 401 when the key is unknown, expired, revoked, or its owner is
 * banned or gone; 429 (with Retry-After) when the key is over its rate. Each accepted call
 * counts against the key's window and records when it was last used.
 */
export async function callerOfKey(auth: Auth, db: Db, key: string, res: Response): Promise<ApiKeyCaller> {
  const answer = (await auth.api.verifyApiKey({ body: { key } })) as VerifyAnswer;
  if (!answer.valid || !answer.key) {
    const code = answer.error?.code;
    if (code === 'RATE_LIMITED' || code === 'USAGE_EXCEEDED') {
      const ms = Number((answer.error?.details as { tryAgainIn?: unknown } | undefined)?.tryAgainIn ?? 60_000);
      const seconds = Math.max(1, Math.ceil((Number.isFinite(ms) ? ms : 60_000) / 1000));
      res.setHeader('Retry-After', String(seconds));
      throw new HttpError(429, 'rate_limited', `Too many requests for this API key; try again in ${seconds} s.`);
    }
    throw new Unauthorized(code === 'KEY_EXPIRED' ? 'This API key has expired.' : code === 'KEY_DISABLED' ? 'This API key has been revoked.' : 'This API key is not valid.');
  }
  const owner = db
    .select({ id: user.id, email: user.email, name: user.name, role: user.role, banned: user.banned })
    .from(user)
    .where(eq(user.id, answer.key.referenceId))
    .get();
  const role = roleSchema.safeParse(owner?.role);
  if (!owner || owner.banned || !role.success) throw new Unauthorized('This API key is not valid.');
  return {
    user: { id: owner.id, email: owner.email, name: owner.name, role: role.data },
    keyId: answer.key.id,
    scopes: permissionsToScopes(answer.key.permissions),
  };
}

type VerifyAnswer = {
  valid: boolean;
  error: { code?: string; message?: string; details?: unknown } | null;
  key: { id: string; referenceId: string; permissions: unknown } | null;
};
