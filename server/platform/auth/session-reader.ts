import { createHmac, timingSafeEqual } from 'node:crypto';
import type { BetterAuthOptions } from 'better-auth';
import type { Statement } from 'better-sqlite3';
import type { Db } from '../db/client';
import type { Auth } from './auth';

// A fast, uncached read of the session on every API request. better-auth's getSession costs
// ~1.5-2.5 ms per call (web-crypto key import and verify, endpoint context, adapter layers);
// this reads the same two rows with one prepared statement and checks the same signed cookie
// with node:crypto. Nothing is remembered between requests, so a sign-out, a revoked session,
// a ban or a role change takes effect on the very next request.
//
// Only the common case is answered here: a well-signed session cookie whose session exists,
// has not expired and does not need extending. Everything else (no such session, expired,
// due for its daily extension, a stale cookie-cache or "don't remember me" cookie, a
// signature in any but the canonical form) goes to better-auth's getSession, which then
// does what it always did (deletes cookies, extends the session, answers null).

export type SessionRow = { id: string; email: string; name: string; role: string | null; banned: number | null };

export type FastSession =
  /** no session cookie at all: better-auth would answer null without touching anything */
  | { kind: 'none' }
  | { kind: 'session'; user: SessionRow }
  /** anything else: ask better-auth */
  | { kind: 'ask-better-auth' };

type Reader = {
  tokenCookie: string;
  otherCookies: string[];
  secret: string;
  expiresInMs: number;
  updateAgeMs: number;
  statement: Statement<[string], { expiresAt: number } & SessionRow>;
};

const readers = new WeakMap<Auth, Map<Db, Promise<Reader | null>>>();

async function makeReader(auth: Auth, db: Db): Promise<Reader | null> {
  const ctx = await auth.$context;
  const o: BetterAuthOptions = ctx.options;
  // the fast path mirrors the configuration we run; with any other, always ask better-auth
  if (o.session?.cookieCache?.enabled || o.secondaryStorage || o.session?.deferSessionRefresh || o.session?.disableSessionRefresh) return null;
  return {
    tokenCookie: ctx.authCookies.sessionToken.name,
    otherCookies: [ctx.authCookies.sessionData.name, ctx.authCookies.dontRememberToken.name],
    secret: ctx.secret,
    expiresInMs: ctx.sessionConfig.expiresIn * 1000,
    updateAgeMs: ctx.sessionConfig.updateAge * 1000,
    statement: db.$client.prepare(
      'select s.expires_at as expiresAt, u.id as id, u.email as email, u.name as name, u.role as role, u.banned as banned from session s join user u on u.id = s.user_id where s.token = ?',
    ),
  };
}

function readerFor(auth: Auth, db: Db): Promise<Reader | null> {
  let perAuth = readers.get(auth);
  if (!perAuth) readers.set(auth, (perAuth = new Map()));
  let r = perAuth.get(db);
  if (!r) perAuth.set(db, (r = makeReader(auth, db)));
  return r;
}

/** The cookies of a Cookie header (first value of each name wins, as better-call reads them). */
export function parseCookieHeader(header: string): Map<string, string> {
  const out = new Map<string, string>();
  for (const part of header.split(';')) {
    const eq = part.indexOf('=');
    if (eq < 0) continue;
    const key = part.slice(0, eq).trim();
    if (out.has(key)) continue;
    let val = part.slice(eq + 1).trim();
    if (val.startsWith('"') && val.endsWith('"') && val.length >= 2) val = val.slice(1, -1);
    try {
      out.set(key, val.includes('%') ? decodeURIComponent(val) : val);
    } catch {
      out.set(key, val);
    }
  }
  return out;
}

/** The signed token (`token.base64(HMAC-SHA256(secret, token))`) if its signature is right, else null. */
export function verifySignedToken(value: string, secret: string): string | null {
  const dot = value.lastIndexOf('.');
  if (dot < 1) return null;
  const token = value.slice(0, dot);
  const signature = Buffer.from(value.slice(dot + 1));
  const expected = Buffer.from(createHmac('sha256', secret).update(token).digest('base64'));
  if (signature.length !== expected.length || !timingSafeEqual(signature, expected)) return null;
  return token;
}

export async function readSessionFast(auth: Auth, db: Db, cookieHeader: string | undefined, now = Date.now()): Promise<FastSession> {
  const reader = await readerFor(auth, db);
  if (!reader) return { kind: 'ask-better-auth' };
  const cookies = parseCookieHeader(cookieHeader ?? '');
  if (reader.otherCookies.some((name) => cookies.has(name))) return { kind: 'ask-better-auth' };
  const signed = cookies.get(reader.tokenCookie);
  if (!signed) return { kind: 'none' };
  const token = verifySignedToken(signed, reader.secret);
  if (token === null) return { kind: 'ask-better-auth' };
  const row = reader.statement.get(token);
  if (!row || !(row.expiresAt > now)) return { kind: 'ask-better-auth' };
  // better-auth extends a session once it is updateAge old (expiresAt - expiresIn + updateAge <= now)
  if (row.expiresAt - reader.expiresInMs + reader.updateAgeMs <= now) return { kind: 'ask-better-auth' };
  const { expiresAt: _expiresAt, ...user } = row;
  return { kind: 'session', user };
}
