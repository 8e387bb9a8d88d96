import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { admin } from 'better-auth/plugins';
import { createAccessControl } from 'better-auth/plugins/access';
import { adminAc, defaultStatements } from 'better-auth/plugins/admin/access';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { apiKeyPlugin, apiKeyPluginPaths } from './api-keys';
import { account, apikey, session, user, verification } from './schema';
import type { Env } from '../env';
import { queueMail } from '../mail/outbox';
import { createSignInGuard, defaultAccountLock, type SignInLimits } from './sign-in-guard';

// better-auth: e-mail + password, Drizzle on SQLite, the admin plugin with our four roles,
// failed sign-ins limited per client address (the socket address, set by the app in a private
// header) and per account (sign-in-guard.ts).

/** The app overwrites this header with req.socket.remoteAddress on every request. */
export const clientIpHeader = 'x-squarewright-client-ip';

const ac = createAccessControl(defaultStatements);
export const accessRoles = {
  admin: ac.newRole(adminAc.statements),
  editor: ac.newRole({ user: [], session: [] }),
  setter: ac.newRole({ user: [], session: [] }),
  printer: ac.newRole({ user: [], session: [] }),
};

export type AuthOptions = {
  db: Db;
  env: Env;
  secret: string;
  clock: Clock;
  /** called after a mail is queued, so the sender delivers it soon */
  onMailQueued?: () => void;
  /** failed sign-ins allowed per window per client address (default SIGN_IN_LIMIT_PER_MINUTE per 60 s) */
  signInLimit?: { window: number; max: number };
  /** failed sign-ins that lock an account, and for how long (default defaultAccountLock) */
  accountLock?: SignInLimits['account'];
};

type RateEntry = { count: number; start: number };

function memoryRateStore() {
  // One store per app instance (better-auth's own memory store is process-wide).
  const entries = new Map<string, RateEntry>();
  return {
    async consume(key: string, rule: { window: number; max: number }) {
      const now = Date.now();
      const windowMs = rule.window * 1000;
      if (entries.size > 10_000) {
        for (const [k, v] of entries) if (now - v.start >= windowMs) entries.delete(k);
      }
      const e = entries.get(key);
      if (!e || now - e.start >= windowMs) {
        entries.set(key, { count: 1, start: now });
        return { allowed: true, retryAfter: null };
      }
      if (e.count >= rule.max) {
        return { allowed: false, retryAfter: Math.ceil((e.start + windowMs - now) / 1000) };
      }
      e.count += 1;
      return { allowed: true, retryAfter: null };
    },
  };
}

export function createAuth(options: AuthOptions) {
  const { db, env } = options;
  const signIn = options.signInLimit ?? { window: 60, max: env.SIGN_IN_LIMIT_PER_MINUTE };
  // failed sign-ins per address and per account (server/platform/auth/sign-in-guard.ts)
  const guard = createSignInGuard({
    limits: { address: signIn, account: options.accountLock ?? defaultAccountLock },
    clock: options.clock,
    db,
    publicUrl: env.PUBLIC_URL,
    addressHeader: clientIpHeader,
    ...(options.onMailQueued ? { onMailQueued: options.onMailQueued } : {}),
  });
  return betterAuth({
    appName: 'Squarewright',
    baseURL: env.PUBLIC_URL,
    basePath: '/api/auth',
    secret: options.secret,
    // the public URL, and the same port on the loopback names (localhost vs 127.0.0.1)
    trustedOrigins: [...new Set([env.PUBLIC_URL, `http://localhost:${env.PORT}`, `http://127.0.0.1:${env.PORT}`])],
    telemetry: { enabled: false },
    database: drizzleAdapter(db, { provider: 'sqlite', schema: { user, session, account, verification, apikey } }),
    // the API-key plugin's own endpoints: keys are made through /api/api-keys (route() + the permission table)
    disabledPaths: apiKeyPluginPaths,
    emailAndPassword: {
      enabled: true,
      // accounts come from invitations (and the demo seed), never from open sign-up
      disableSignUp: true,
      minPasswordLength: 10,
      maxPasswordLength: 128,
      resetPasswordTokenExpiresIn: 60 * 60,
      revokeSessionsOnPasswordReset: true,
      // the reset proved the mailbox: an account locked by failed sign-ins is open again
      onPasswordReset: async ({ user: u }) => guard.unlock(u.email),
      sendResetPassword: async ({ user: u, token }) => {
        // a deactivated account gets no reset mail (the answer to the request is the same)
        if ((u as { banned?: boolean | null }).banned) return;
        queueMail(
          db,
          {
            to: u.email,
            template: 'password-reset',
            data: {
              name: u.name,
              email: u.email,
              link: `${env.PUBLIC_URL}/reset-password?token=${encodeURIComponent(token)}`,
            },
          },
          options.clock.now(),
        );
        options.onMailQueued?.();
      },
    },
    session: { expiresIn: 60 * 60 * 24 * 7, updateAge: 60 * 60 * 24 },
    plugins: [admin({ ac, roles: accessRoles, defaultRole: 'setter', adminRoles: ['admin'] }), apiKeyPlugin(env.API_KEY_RATE_PER_MINUTE), guard.plugin],
    rateLimit: {
      enabled: true,
      window: 60,
      max: 300,
      // sign-in: failed attempts are counted by the guard (per address and per account); this
      // rule (it replaces better-auth's own 3 per 10 s, which counts successes too) only brakes floods
      customRules: {
        '/sign-in/*': { window: 60, max: Math.max(100, signIn.max * 5) },
        '/request-password-reset': { window: 60, max: 5 },
        '/reset-password': { window: 60, max: 10 },
      },
      customStorage: memoryRateStore(),
    },
    advanced: {
      // explicit, so tests (NODE_ENV=test turns the check off by default) see production behaviour
      disableOriginCheck: false,
      disableCSRFCheck: false,
      ipAddress: { ipAddressHeaders: [clientIpHeader] },
      useSecureCookies: env.PUBLIC_URL.startsWith('https://'),
      defaultCookieAttributes: { httpOnly: true, sameSite: 'lax' },
    },
    logger: { disabled: env.LOG_LEVEL === 'silent' || env.NODE_ENV === 'test', log: betterAuthLog },
  });
}

/**
 * better-auth's own log lines, as it writes them, except one: an unknown, expired or revoked API
 * key is the caller's mistake (route() answers 401 in our words), not an error of the server.
 */
export function betterAuthLog(level: 'debug' | 'info' | 'warn' | 'error', message: string, ...args: unknown[]): void {
  if (message.startsWith('Failed to validate API key')) return;
  const write = level === 'error' ? console.error : level === 'warn' ? console.warn : console.log;
  write(`${new Date().toISOString()} ${level.toUpperCase()} [Better Auth]: ${message}`, ...args);
}

export type Auth = ReturnType<typeof createAuth>;
