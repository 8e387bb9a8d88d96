import type { RequestHandler } from 'express';
import type { ErrorBody } from '../../../shared/contracts/common';
import type { Env } from '../env';

// Cross-site request forgery: every state-changing request (any method but GET, HEAD and
// OPTIONS, whatever its body: JSON, multipart, form, or none) must come from a page of our
// own origin. Browsers send `Origin` with every such request (and `Referer`, under our
// referrer policy 'same-origin', when an old one leaves Origin out); a forged form or
// script on another site carries that site's origin, or none we accept. See
// docs/decisions/008-same-origin-requests.md.
//
// Exempt: requests that carry `Authorization: Bearer ...` (a cross-site page cannot set that
// header without CORS, which this app never allows; the API key is checked where it is
// used), and the paths in `exemptPaths` (the payments webhook, checked by its signature).

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

const LOOPBACK_HOSTS = ['localhost', '127.0.0.1', '[::1]'];

/** The origins whose pages may change state: PUBLIC_URL's, plus its loopback aliases on the same port. */
export function allowedOrigins(env: Pick<Env, 'PUBLIC_URL' | 'PORT'>): string[] {
  const url = new URL(env.PUBLIC_URL);
  const out = new Set([url.origin]);
  // http://localhost:3000 and http://127.0.0.1:3000 are the same server for a local user
  // (better-auth trusts both as well); only when PUBLIC_URL itself is a loopback address.
  if (LOOPBACK_HOSTS.includes(url.hostname)) {
    const ports = new Set([url.port || (url.protocol === 'https:' ? '443' : '80'), String(env.PORT)]);
    for (const host of LOOPBACK_HOSTS) for (const port of ports) out.add(`${url.protocol}//${host}:${port}`);
  }
  return [...out];
}

/** The origin of a Referer value, or null when it is not an absolute http(s) URL. */
function refererOrigin(referer: string): string | null {
  try {
    const u = new URL(referer);
    return u.protocol === 'http:' || u.protocol === 'https:' ? u.origin : null;
  } catch {
    return null;
  }
}

function clipHeader(value: string): string {
  return value.length > 60 ? `${value.slice(0, 57)}...` : value;
}

export type SameOriginOptions = {
  origins: readonly string[];
  /** exact paths (no query) that are exempt, e.g. '/api/payments/webhook' */
  exemptPaths?: readonly string[];
};

/** Why a request is refused, or null when it may go on. */
export function crossSiteReason(
  req: { method: string; path: string; headers: Record<string, string | string[] | undefined> },
  options: SameOriginOptions,
): { message: string; path: string } | null {
  if (SAFE_METHODS.has(req.method)) return null;
  if (options.exemptPaths?.includes(req.path)) return null;
  const authorization = req.headers.authorization;
  if (typeof authorization === 'string' && /^Bearer\s+\S/i.test(authorization)) return null;
  const origin = req.headers.origin;
  if (typeof origin === 'string' && origin !== '') {
    if (options.origins.includes(origin)) return null;
    return { path: 'headers.origin', message: `requests from ${clipHeader(origin)} may not change anything here` };
  }
  const referer = req.headers.referer;
  if (typeof referer === 'string' && referer !== '') {
    const from = refererOrigin(referer);
    if (from !== null && options.origins.includes(from)) return null;
    return { path: 'headers.referer', message: `requests from ${clipHeader(from ?? referer)} may not change anything here` };
  }
  return { path: 'headers.origin', message: 'the request says neither where it comes from (Origin) nor from which page (Referer)' };
}

/** Express middleware: 403 `forbidden` in our error shape for a cross-site or unlabelled state change. */
export function sameOriginGuard(options: SameOriginOptions): RequestHandler {
  return (req, res, next) => {
    const reason = crossSiteReason(req, options);
    if (!reason) {
      next();
      return;
    }
    const body: ErrorBody = {
      error: {
        code: 'forbidden',
        message: `Cross-site request refused: ${reason.message}. Changes are accepted only from pages of this app (${options.origins[0] ?? 'its own origin'}).`,
        details: [reason],
      },
    };
    res.status(403).json(body);
  };
}
