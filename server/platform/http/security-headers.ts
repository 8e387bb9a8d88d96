import type { RequestHandler, Response } from 'express';
import helmet from 'helmet';

// Response headers (helmet): a Content-Security-Policy the built client passes with no inline
// script, no framing by other sites, nosniff, and a referrer policy that never sends our
// URLs (tokens in /invite/... or /reset-password?token=...) to another site.
//
// Framing: `frame-ancestors 'none'` and `X-Frame-Options: DENY` everywhere, except
//  - our own PDF files, which our pages show in an <iframe>: `'self'` (route() calls
//    allowFraming for routes that produce PDF);
//  - pages under /embed/ (issue 20): a route there sets `res.locals.frameAncestors` to the
//    list of origins allowed to frame it, before the answer is written; those origins are
//    put into the header when it is written (see interfaces.md, 2025 CSP/embeds).

export type CspMode = 'built' | 'vite';

/** The CSP directives. `vite` (npm run dev) allows Vite's inline preamble, injected styles and its websocket. */
export function cspDirectives(mode: CspMode, https: boolean): Record<string, string[] | null> {
  const dev = mode === 'vite';
  return {
    'default-src': ["'self'"],
    'base-uri': ["'self'"],
    'script-src': dev ? ["'self'", "'unsafe-inline'"] : ["'self'"],
    'script-src-attr': ["'none'"],
    // tiptap writes the editor's few style rules into a <style> element, and React sets
    // style attributes: styles (never scripts) may be inline
    'style-src': ["'self'", "'unsafe-inline'"],
    'img-src': ["'self'", 'data:', 'blob:'],
    'font-src': ["'self'", 'data:'],
    'connect-src': dev ? ["'self'", 'ws:', 'wss:'] : ["'self'"],
    'frame-src': ["'self'"],
    'object-src': ["'none'"],
    'form-action': ["'self'"],
    'frame-ancestors': ["'none'"],
    'upgrade-insecure-requests': https ? [] : null,
  };
}

export function securityHeaders(options: { mode: CspMode; https: boolean }): RequestHandler {
  const h = helmet({
    contentSecurityPolicy: { useDefaults: false, directives: cspDirectives(options.mode, options.https) },
    xFrameOptions: { action: 'deny' },
    referrerPolicy: { policy: 'same-origin' },
    strictTransportSecurity: options.https ? { maxAge: 180 * 24 * 60 * 60, includeSubDomains: false } : false,
    // the PDFs open in a new tab from our pages; same-origin keeps other sites' windows out
    crossOriginOpenerPolicy: { policy: 'same-origin' },
    crossOriginResourcePolicy: { policy: 'same-origin' },
  });
  return (req, res, next) => {
    h(req, res, (err?: unknown) => {
      if (err) {
        next(err);
        return;
      }
      if (req.path.startsWith('/embed/')) frameAncestorsFromLocals(res);
      next();
    });
  };
}

const ORIGIN = /^https?:\/\/[a-z0-9.-]+(:\d{1,5})?$/i;

/**
 * Let `ancestors` frame this answer: `'self'` or origins like `https://news.example`.
 * Anything else in the list is dropped (no wildcards, no paths); an empty list keeps 'none'.
 */
export function allowFraming(res: Response, ancestors: readonly string[]): void {
  const list = ancestors.filter((a) => a === "'self'" || ORIGIN.test(a));
  const csp = res.getHeader('Content-Security-Policy');
  if (typeof csp !== 'string' || list.length === 0) return;
  res.setHeader('Content-Security-Policy', csp.replace(/frame-ancestors [^;]*/, `frame-ancestors ${list.join(' ')}`));
  if (list.length === 1 && list[0] === "'self'") res.setHeader('X-Frame-Options', 'SAMEORIGIN');
  else res.removeHeader('X-Frame-Options'); // X-Frame-Options cannot name another origin; CSP rules
}

/** /embed/: apply `res.locals.frameAncestors` (string[]) just before the head is written. */
function frameAncestorsFromLocals(res: Response): void {
  const writeHead = res.writeHead;
  res.writeHead = function patchedWriteHead(this: Response, ...args: Parameters<Response['writeHead']>) {
    const ancestors: unknown = res.locals.frameAncestors;
    if (Array.isArray(ancestors)) allowFraming(res, ancestors.filter((a): a is string => typeof a === 'string'));
    return writeHead.apply(this, args);
  } as Response['writeHead'];
}
