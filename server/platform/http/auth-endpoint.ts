import { z } from 'zod';
import { fromNodeHeaders } from 'better-auth/node';
import express, { type RequestHandler } from 'express';
import type { ErrorBody } from '../../../shared/contracts/common';
import type { Auth } from '../auth/auth';
import { authErrorWords, ownAuthCodes } from './auth-words';
import { jsonDepthProblem, MAX_JSON_DEPTH } from './json-depth';

/** better-auth's error body, as far as we read it (other fields are ignored; non-strings count as absent). */
const libraryErrorSchema = z.object({ code: z.string().optional().catch(undefined), message: z.string().optional().catch(undefined) });

// /api/auth/*: better-auth behind our own door. The body is read here, with a size limit
// (413 in our error shape; better-auth's own adapter reads any size into memory), checked as
// JSON (400) and for depth (422), then handed to better-auth as a Web Request. Its error
// answers are rewritten into `{ error: { code, message } }` with our words
// (server/platform/http/auth-words.ts); everything else (cookies, redirects) passes through.

/** Sign-in, reset and sign-out bodies are a few hundred bytes. */
export const AUTH_BODY_LIMIT_BYTES = 16 * 1024;

function errorBody(code: string, message: string, details?: unknown): ErrorBody {
  return { error: details === undefined ? { code, message } : { code, message, details } };
}

export function authEndpoint(auth: Auth, publicUrl: string): RequestHandler[] {
  const origin = new URL(publicUrl).origin;
  const readBody = express.raw({ type: () => true, limit: AUTH_BODY_LIMIT_BYTES });
  const handle: RequestHandler = async (req, res, next) => {
    try {
      const raw: unknown = req.body;
      const text = Buffer.isBuffer(raw) && raw.length > 0 ? raw.toString('utf8') : undefined;
      if (text !== undefined && /json/i.test(String(req.headers['content-type'] ?? ''))) {
        let parsed: unknown;
        try {
          parsed = JSON.parse(text);
        } catch {
          res.status(400).json(errorBody('bad_request', 'The request body is not valid JSON.'));
          return;
        }
        const deep = jsonDepthProblem(parsed, 'body');
        if (deep) {
          res.status(422).json(errorBody('unprocessable', `The request body is nested more than ${MAX_JSON_DEPTH} levels deep.`, [deep]));
          return;
        }
      }
      const headers = fromNodeHeaders(req.headers);
      headers.delete('content-length');
      headers.delete('transfer-encoding');
      const method = req.method.toUpperCase();
      const request = new Request(origin + req.originalUrl, {
        method,
        headers,
        ...(text !== undefined && method !== 'GET' && method !== 'HEAD' ? { body: text } : {}),
      });
      const response = await auth.handler(request);
      for (const [name, value] of response.headers) {
        if (name === 'set-cookie' || name === 'content-length') continue;
        res.setHeader(name, value);
      }
      const cookies = response.headers.getSetCookie();
      if (cookies.length > 0) res.setHeader('Set-Cookie', cookies);
      const bytes = Buffer.from(await response.arrayBuffer());
      if (response.status >= 400) {
        let libraryCode: string | undefined;
        let libraryMessage: string | undefined;
        try {
          const parsed = libraryErrorSchema.safeParse(JSON.parse(bytes.toString('utf8')));
          if (parsed.success) {
            libraryCode = parsed.data.code;
            libraryMessage = parsed.data.message;
          }
        } catch {
          // not JSON: our words for its status
        }
        const own = libraryCode !== undefined && ownAuthCodes.has(libraryCode) && libraryMessage !== undefined;
        const words = authErrorWords(response.status, libraryCode);
        res.removeHeader('content-type');
        res.status(response.status).json(errorBody(words.code, own ? libraryMessage! : words.message));
        return;
      }
      res.status(response.status).end(bytes);
    } catch (err) {
      next(err);
    }
  };
  return [readBody, handle];
}
