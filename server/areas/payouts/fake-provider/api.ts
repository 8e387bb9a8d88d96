import { accountById, createAccount, createAccountLink } from './accounts';
import type { FakeContext } from './context';
import { asFakeError, errorBody, FakeError } from './errors';
import { jsonAnswer, type Answer, type FakeRequest } from './http-server';
import { createPayout, createTransfer, retrievePayout, type Settlement } from './money';
import { parseFormBody, type FormFields } from './params';
import { FAKE_SECRET_KEY } from './types';

// The provider's API under /v1, as far as our SDK calls it: the route table, then what
// every call goes through, in the provider's order: the API key, an outage switched on by
// failNextRequest, the Idempotency-Key (same key and parameters: the first answer again,
// marked Idempotent-Replayed; other parameters: an idempotency error), the call itself,
// and its answer or the error envelope. Every POST saves the state file.

type ApiCall = { id: string; fields: FormFields; stripeAccount: string | undefined };
type ApiRoute = { method: 'GET' | 'POST'; pattern: RegExp; handle(call: ApiCall): object };

export function apiRoutes(ctx: FakeContext, settlement: Settlement, baseUrl: () => string): ApiRoute[] {
  return [
    { method: 'POST', pattern: /^\/v1\/accounts$/, handle: ({ fields }) => createAccount(ctx, fields) },
    { method: 'GET', pattern: /^\/v1\/accounts\/(\w+)$/, handle: ({ id }) => accountById(ctx.state, id) },
    { method: 'POST', pattern: /^\/v1\/account_links$/, handle: ({ fields }) => createAccountLink(ctx, fields, baseUrl()) },
    { method: 'POST', pattern: /^\/v1\/transfers$/, handle: ({ fields }) => createTransfer(ctx, fields) },
    {
      method: 'POST',
      pattern: /^\/v1\/payouts$/,
      handle: ({ fields, stripeAccount }) => {
        const payout = createPayout(ctx, fields, stripeAccount);
        settlement.scheduled(payout.id);
        return payout;
      },
    },
    { method: 'GET', pattern: /^\/v1\/payouts\/(\w+)$/, handle: ({ id, stripeAccount }) => retrievePayout(ctx, id, stripeAccount) },
  ];
}

export function unrecognized(method: string, path: string): FakeError {
  return new FakeError(404, 'invalid_request_error', 'resource_missing', `Unrecognized request URL (${method}: ${path}).`);
}

/** Answers one /v1 request. */
export function answerApiRequest(ctx: FakeContext, routes: ApiRoute[], req: FakeRequest): Answer {
  const { method, path, body } = req;
  try {
    ctx.stats.requests++;
    if (req.header('authorization') !== `Bearer ${FAKE_SECRET_KEY}`) {
      throw new FakeError(401, 'invalid_request_error', 'api_key_invalid', 'Invalid API Key provided. The local fake accepts only its own test key.');
    }
    if (ctx.failures.nextRequest.delete(`${method} ${path}`)) throw new FakeError(500, 'api_error', 'fake_outage', 'The local fake was told to fail this request once.');
    const route = routes.find((r) => r.method === method && r.pattern.test(path));
    if (!route) throw unrecognized(method, path);
    const stripeAccount = req.header('stripe-account');
    const key = req.header('idempotency-key');
    const keyHeader: Record<string, string> = key ? { 'idempotency-key': key } : {};
    const scope = key && method === 'POST' ? `${stripeAccount ?? 'platform'}\u0000${key}` : undefined;
    const fingerprint = `${method} ${path} ${body}`;
    const seen = scope ? ctx.state.idempotency.get(scope) : undefined;
    if (seen) {
      if (seen.fingerprint !== fingerprint) {
        throw new FakeError(400, 'idempotency_error', 'idempotency_key_in_use', `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}'.`);
      }
      ctx.stats.replays++;
      ctx.log(`replay ${method} ${path} (${key})`);
      return jsonAnswer(seen.status, seen.body, { 'idempotent-replayed': 'true', ...keyHeader });
    }
    const fields = method === 'POST' ? parseFormBody(body) : Object.fromEntries(req.query);
    const id = path.match(route.pattern)?.[1] ?? '';
    let answer: { status: number; body: string };
    try {
      answer = { status: 200, body: JSON.stringify(route.handle({ id, fields, stripeAccount })) };
    } catch (error) {
      if (!(error instanceof FakeError)) throw error;
      answer = { status: error.status, body: errorBody(error) };
    }
    // The provider keeps the answer to an idempotent request, errors included (not 5xx).
    if (scope && answer.status < 500) ctx.state.idempotency.set(scope, { fingerprint, ...answer });
    if (method === 'POST') ctx.save();
    ctx.log(`${method} ${path} -> ${answer.status}`);
    return jsonAnswer(answer.status, answer.body, keyHeader);
  } catch (error) {
    const e = asFakeError(error);
    return jsonAnswer(e.status, errorBody(e));
  }
}
