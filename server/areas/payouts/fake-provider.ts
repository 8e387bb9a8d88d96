import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { dirname } from 'node:path';
import Stripe from 'stripe';

// A local stand-in for the payments provider, so development, the demo and the tests run
// without network or a real key. It answers the few endpoints our SDK calls the way the
// provider's API does (form-encoded bodies, objects with ids, the error envelope,
// Idempotency-Key replays), simulates the provider's hosted onboarding page, settles
// payouts a moment later and reports the result with a signed webhook, like the real
// thing. Failures on demand: flag an account so its transfers are refused or its payouts
// fail, or make the next call to a path answer 500.

export const FAKE_SECRET_KEY = 'sk_test_squarewright_local_fake';

export type PaymentsFakeOptions = {
  /** Secret the webhooks are signed with (our PAYMENTS_WEBHOOK_SECRET). */
  webhookSecret: string;
  /** Where webhooks go; may be set later with setWebhookUrl (our port is known after listen). */
  webhookUrl?: string;
  /** Delay before a pending payout settles (ms). Default 300. */
  settleDelayMs?: number;
  /** Settle payouts on a timer (default true); tests may turn it off and call settleAll(). */
  autoSettle?: boolean;
  /** Log line sink; default silent. */
  log?: (line: string) => void;
  /**
   * Keep the fake's objects (accounts, transfers, payouts, balances, idempotency cache) in
   * this JSON file, so a restarted dev server finds the accounts and keys it made before.
   * Failure flags are not kept. Default: memory only.
   */
  stateFile?: string;
};

type Obj = Record<string, unknown>;
type Account = Obj & { id: string; details_submitted: boolean; payouts_enabled: boolean };
type PayoutObj = Obj & { id: string; status: 'pending' | 'paid' | 'failed'; amount: number; currency: string };

export type PaymentsFakeStats = {
  /** Every API request received (replays included). */
  requests: number;
  /** Idempotent replays answered from the cache. */
  replays: number;
  created: { accounts: number; accountLinks: number; transfers: number; payouts: number };
  webhooksDelivered: number;
  webhooksFailed: number;
};

export type PaymentsFake = {
  host: string;
  port: number;
  url: string;
  /** The API key the fake accepts. */
  secretKey: string;
  setWebhookUrl(url: string): void;
  /** Refuse transfers to this account (a synchronous provider error). */
  failTransfersFor(accountId: string, message?: string): void;
  /** Let this account's payouts fail when they settle (reported by webhook). */
  failPayoutsFor(accountId: string, message?: string): void;
  clearFailures(accountId: string): void;
  /** The next request to this method+path answers 500 (a transient provider error). */
  failNextRequest(method: string, path: string): void;
  /** Marks an account as onboarded (what the hosted page does). */
  completeOnboarding(accountId: string): void;
  /** Settles every pending payout now and waits for the webhooks to be delivered. */
  settleAll(): Promise<void>;
  stats(): PaymentsFakeStats;
  /** Sum of paid payouts per currency (lower case) for an account: what reached the bank. */
  paidOutTo(accountId: string): Record<string, number>;
  /** Connected account balance per currency (lower case). */
  balanceOf(accountId: string): Record<string, number>;
  stop(): Promise<void>;
};

class FakeError extends Error {
  constructor(
    readonly status: number,
    readonly type: string,
    readonly code: string,
    message: string,
    readonly param?: string,
  ) {
    super(message);
  }
}

/** Parses the provider's form encoding (`metadata[a]=1&capabilities[transfers][requested]=true`) into nested objects. */
export function parseFormBody(body: string): Obj {
  const out: Obj = {};
  for (const [rawKey, value] of new URLSearchParams(body)) {
    const parts = rawKey.split('[').map((p, i) => (i === 0 ? p : p.replace(/\]$/, '')));
    let node: Obj = out;
    parts.forEach((part, i) => {
      if (i === parts.length - 1) node[part] = value;
      else {
        const next = node[part];
        if (typeof next !== 'object' || next === null) node[part] = {};
        node = node[part] as Obj;
      }
    });
  }
  return out;
}

function newId(prefix: string): string {
  return `${prefix}_${randomBytes(12).toString('base64url').replace(/[-_]/g, 'x')}`;
}

function nowSec(): number {
  return Math.floor(Date.now() / 1000);
}

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function requireString(params: Obj, name: string): string {
  const v = params[name];
  if (typeof v !== 'string' || v === '') throw new FakeError(400, 'invalid_request_error', 'parameter_missing', `Missing required param: ${name}.`, name);
  return v;
}

function requireAmount(params: Obj): number {
  const raw = requireString(params, 'amount');
  if (!/^\d+$/.test(raw) || Number(raw) <= 0) throw new FakeError(400, 'invalid_request_error', 'parameter_invalid_integer', 'Invalid positive integer', 'amount');
  return Number(raw);
}

export async function startPaymentsFake(options: PaymentsFakeOptions): Promise<PaymentsFake> {
  const log = options.log ?? (() => {});
  const settleDelayMs = options.settleDelayMs ?? 300;
  const autoSettle = options.autoSettle ?? true;
  const signer = new Stripe(FAKE_SECRET_KEY);
  let webhookUrl = options.webhookUrl;

  const accounts = new Map<string, Account>();
  const links = new Map<string, { account: string; returnUrl: string; refreshUrl: string; expiresAt: number }>();
  const transfers = new Map<string, Obj>();
  const payouts = new Map<string, { payout: PayoutObj; account: string }>();
  const balances = new Map<string, Map<string, number>>();
  const failTransfers = new Map<string, string>();
  const failPayouts = new Map<string, string>();
  const failNext = new Set<string>();
  const idempotency = new Map<string, { fingerprint: string; status: number; body: string }>();
  const timers = new Set<NodeJS.Timeout>();
  const deliveries = new Set<Promise<void>>();
  const stats: PaymentsFakeStats = {
    requests: 0,
    replays: 0,
    created: { accounts: 0, accountLinks: 0, transfers: 0, payouts: 0 },
    webhooksDelivered: 0,
    webhooksFailed: 0,
  };

  function saveState(): void {
    if (!options.stateFile) return;
    const data = {
      accounts: [...accounts.values()],
      links: [...links.entries()],
      transfers: [...transfers.values()],
      payouts: [...payouts.values()],
      balances: [...balances.entries()].map(([a, m]) => [a, [...m.entries()]]),
      idempotency: [...idempotency.entries()],
    };
    mkdirSync(dirname(options.stateFile), { recursive: true });
    const tmp = `${options.stateFile}.${process.pid}.tmp`;
    writeFileSync(tmp, JSON.stringify(data));
    renameSync(tmp, options.stateFile);
  }

  function loadState(): void {
    if (!options.stateFile || !existsSync(options.stateFile)) return;
    try {
      const data = JSON.parse(readFileSync(options.stateFile, 'utf8')) as {
        accounts: Account[];
        links: [string, { account: string; returnUrl: string; refreshUrl: string; expiresAt: number }][];
        transfers: Obj[];
        payouts: { payout: PayoutObj; account: string }[];
        balances: [string, [string, number][]][];
        idempotency: [string, { fingerprint: string; status: number; body: string }][];
      };
      for (const a of data.accounts) accounts.set(a.id, a);
      for (const [id, l] of data.links) links.set(id, l);
      for (const t of data.transfers) transfers.set(String(t.id), t);
      for (const p of data.payouts) payouts.set(p.payout.id, p);
      for (const [a, m] of data.balances) balances.set(a, new Map(m));
      for (const [k, v] of data.idempotency) idempotency.set(k, v);
      log(`state loaded from ${options.stateFile}: ${accounts.size} accounts, ${payouts.size} payouts`);
    } catch (error) {
      log(`state file ${options.stateFile} unreadable, starting empty (${(error as Error).message})`);
    }
  }

  const balance = (account: string) => {
    let b = balances.get(account);
    if (!b) balances.set(account, (b = new Map()));
    return b;
  };

  function sendWebhook(type: string, object: Obj, account?: string): void {
    if (!webhookUrl) return;
    const event = {
      id: newId('evt'),
      object: 'event',
      api_version: Stripe.API_VERSION,
      created: nowSec(),
      type,
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      data: { object },
      ...(account ? { account } : {}),
    };
    const payload = JSON.stringify(event);
    const target = webhookUrl;
    const deliver = async () => {
      for (let attempt = 1; attempt <= 3; attempt++) {
        try {
          const header = signer.webhooks.generateTestHeaderString({ payload, secret: options.webhookSecret });
          const res = await fetch(target, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': header }, body: payload });
          if (res.ok) {
            stats.webhooksDelivered++;
            log(`webhook ${type} delivered`);
            return;
          }
          log(`webhook ${type} answered ${res.status}`);
        } catch (error) {
          log(`webhook ${type} not delivered: ${(error as Error).message}`);
        }
        await new Promise((r) => setTimeout(r, 100 * attempt));
      }
      stats.webhooksFailed++;
    };
    const p = deliver().finally(() => deliveries.delete(p));
    deliveries.add(p);
  }

  function settle(id: string): void {
    const entry = payouts.get(id);
    if (!entry || entry.payout.status !== 'pending') return;
    const failure = failPayouts.get(entry.account);
    if (failure) {
      entry.payout.status = 'failed';
      entry.payout.failure_code = 'account_closed';
      entry.payout.failure_message = failure;
      const b = balance(entry.account);
      b.set(entry.payout.currency, (b.get(entry.payout.currency) ?? 0) + entry.payout.amount);
      sendWebhook('payout.failed', entry.payout, entry.account);
    } else {
      entry.payout.status = 'paid';
      sendWebhook('payout.paid', entry.payout, entry.account);
    }
    saveState();
  }

  function scheduleSettle(id: string): void {
    const t = setTimeout(() => {
      timers.delete(t);
      settle(id);
    }, settleDelayMs);
    timers.add(t);
  }

  function accountObject(id: string): Account {
    const a = accounts.get(id);
    if (!a) throw new FakeError(404, 'invalid_request_error', 'resource_missing', `No such account: '${id}'`, 'account');
    return a;
  }

  const routes: { method: string; pattern: RegExp; handle: (m: RegExpMatchArray, params: Obj, stripeAccount: string | undefined) => Obj }[] = [
    {
      method: 'POST',
      pattern: /^\/v1\/accounts$/,
      handle: (_m, params) => {
        const id = newId('acct');
        const account: Account = {
          id,
          object: 'account',
          type: typeof params.type === 'string' ? params.type : 'express',
          country: typeof params.country === 'string' ? params.country : 'GB',
          email: typeof params.email === 'string' ? params.email : null,
          metadata: (params.metadata as Obj | undefined) ?? {},
          created: nowSec(),
          details_submitted: false,
          payouts_enabled: false,
          charges_enabled: false,
          capabilities: { transfers: 'inactive' },
          external_accounts: { object: 'list', data: [], has_more: false, url: `/v1/accounts/${id}/external_accounts` },
        };
        accounts.set(id, account);
        stats.created.accounts++;
        return account;
      },
    },
    { method: 'GET', pattern: /^\/v1\/accounts\/([\w]+)$/, handle: (m) => accountObject(m[1] ?? '') },
    {
      method: 'POST',
      pattern: /^\/v1\/account_links$/,
      handle: (_m, params) => {
        const account = accountObject(requireString(params, 'account')).id;
        const returnUrl = requireString(params, 'return_url');
        const refreshUrl = requireString(params, 'refresh_url');
        const id = newId('link');
        const expiresAt = nowSec() + 300;
        links.set(id, { account, returnUrl, refreshUrl, expiresAt });
        stats.created.accountLinks++;
        return { object: 'account_link', created: nowSec(), expires_at: expiresAt, url: `${baseUrl()}/connect/onboarding/${id}` };
      },
    },
    {
      method: 'POST',
      pattern: /^\/v1\/transfers$/,
      handle: (_m, params) => {
        const amount = requireAmount(params);
        const currency = requireString(params, 'currency').toLowerCase();
        const destination = requireString(params, 'destination');
        const account = accountObject(destination);
        const refusal = failTransfers.get(destination);
        if (refusal) throw new FakeError(400, 'invalid_request_error', 'account_invalid', refusal, 'destination');
        if (!account.details_submitted) {
          throw new FakeError(400, 'invalid_request_error', 'account_invalid', `Account ${destination} has not finished onboarding; its transfers capability is inactive.`, 'destination');
        }
        const b = balance(destination);
        b.set(currency, (b.get(currency) ?? 0) + amount);
        const transfer = {
          id: newId('tr'),
          object: 'transfer',
          amount,
          currency,
          destination,
          created: nowSec(),
          metadata: (params.metadata as Obj | undefined) ?? {},
          transfer_group: params.transfer_group ?? null,
          reversed: false,
          livemode: false,
        };
        transfers.set(transfer.id, transfer);
        stats.created.transfers++;
        sendWebhook('transfer.created', transfer);
        return transfer;
      },
    },
    {
      method: 'POST',
      pattern: /^\/v1\/payouts$/,
      handle: (_m, params, stripeAccount) => {
        if (!stripeAccount) throw new FakeError(400, 'invalid_request_error', 'parameter_missing', 'This fake pays out from connected accounts only: send the Stripe-Account header.');
        accountObject(stripeAccount);
        const amount = requireAmount(params);
        const currency = requireString(params, 'currency').toLowerCase();
        const b = balance(stripeAccount);
        const available = b.get(currency) ?? 0;
        if (available < amount) {
          throw new FakeError(400, 'invalid_request_error', 'balance_insufficient', `You have insufficient funds in your account (${available} ${currency} available, ${amount} requested).`, 'amount');
        }
        b.set(currency, available - amount);
        const payout: PayoutObj = {
          id: newId('po'),
          object: 'payout',
          amount,
          currency,
          status: 'pending',
          created: nowSec(),
          arrival_date: nowSec() + 86_400,
          metadata: (params.metadata as Obj | undefined) ?? {},
          failure_code: null,
          failure_message: null,
          method: 'standard',
          type: 'bank_account',
          livemode: false,
        };
        payouts.set(payout.id, { payout, account: stripeAccount });
        stats.created.payouts++;
        if (autoSettle) scheduleSettle(payout.id);
        return payout;
      },
    },
    {
      method: 'GET',
      pattern: /^\/v1\/payouts\/([\w]+)$/,
      handle: (m, _params, stripeAccount) => {
        const entry = payouts.get(m[1] ?? '');
        if (!entry || (stripeAccount && entry.account !== stripeAccount)) throw new FakeError(404, 'invalid_request_error', 'resource_missing', `No such payout: '${m[1]}'`, 'id');
        return entry.payout;
      },
    },
  ];

  function baseUrl(): string {
    const addr = server.address() as AddressInfo;
    return `http://127.0.0.1:${addr.port}`;
  }

  function sendJson(res: http.ServerResponse, status: number, body: string, extra: Record<string, string> = {}): void {
    res.writeHead(status, { 'content-type': 'application/json', 'request-id': newId('req'), ...extra });
    res.end(body);
  }

  function onboardingPage(res: http.ServerResponse, linkId: string, method: string): void {
    const link = links.get(linkId);
    if (!link || link.expiresAt < nowSec()) {
      res.writeHead(410, { 'content-type': 'text/html; charset=utf-8' });
      res.end('<!doctype html><title>Link expired</title><p>This onboarding link has expired. Go back to Squarewright and start again.</p>');
      return;
    }
    const account = accountObject(link.account);
    if (method === 'POST') {
      account.details_submitted = true;
      account.payouts_enabled = true;
      account.capabilities = { transfers: 'active' };
      account.external_accounts = {
        object: 'list',
        data: [{ id: newId('ba'), object: 'bank_account', bank_name: 'Fake Test Bank', last4: '6789', currency: 'gbp', country: account.country }],
        has_more: false,
      };
      links.delete(linkId);
      saveState();
      sendWebhook('account.updated', account, account.id);
      res.writeHead(303, { location: link.returnUrl });
      res.end();
      return;
    }
    res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
    res.end(`<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Local payments provider: payout details</title></head>
<body style="font-family: sans-serif; max-width: 36rem; margin: 3rem auto">
<h1>Local payments provider (test)</h1>
<p>This page stands in for the provider's hosted form where a setter enters bank details.
Nothing is collected here: submitting attaches a test bank account ending 6789 to ${escapeHtml(account.id)}.</p>
<form method="post"><button type="submit">Submit test bank details</button></form>
<p><a href="${escapeHtml(link.refreshUrl)}">Cancel</a></p></body></html>`);
  }

  function control(path: string, method: string, res: http.ServerResponse): boolean {
    let m: RegExpMatchArray | null;
    if (method === 'GET' && path === '/__fake/stats') {
      sendJson(res, 200, JSON.stringify(stats));
      return true;
    }
    if (method === 'POST' && path === '/__fake/settle') {
      void api.settleAll().then(() => sendJson(res, 200, JSON.stringify({ settled: true })));
      return true;
    }
    if (method === 'POST' && (m = path.match(/^\/__fake\/accounts\/([\w]+)\/(fail-payouts|fail-transfers|clear-failures|complete-onboarding)$/))) {
      const id = m[1] ?? '';
      if (m[2] === 'fail-payouts') api.failPayoutsFor(id);
      else if (m[2] === 'fail-transfers') api.failTransfersFor(id);
      else if (m[2] === 'complete-onboarding') api.completeOnboarding(id);
      else api.clearFailures(id);
      sendJson(res, 200, JSON.stringify({ ok: true }));
      return true;
    }
    return false;
  }

  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const method = req.method ?? 'GET';
      const url = new URL(req.url ?? '/', 'http://127.0.0.1');
      const path = url.pathname;
      const body = Buffer.concat(chunks).toString('utf8');
      try {
        let m: RegExpMatchArray | null;
        if ((m = path.match(/^\/connect\/onboarding\/([\w]+)$/))) return onboardingPage(res, m[1] ?? '', method);
        if (path.startsWith('/__fake/') && control(path, method, res)) return;
        if (!path.startsWith('/v1/')) throw new FakeError(404, 'invalid_request_error', 'resource_missing', `Unrecognized request URL (${method}: ${path}).`);
        stats.requests++;
        const auth = req.headers.authorization ?? '';
        if (auth !== `Bearer ${FAKE_SECRET_KEY}`) {
          throw new FakeError(401, 'invalid_request_error', 'api_key_invalid', 'Invalid API Key provided. The local fake accepts only its own test key.');
        }
        const transient = `${method} ${path}`;
        if (failNext.delete(transient)) throw new FakeError(500, 'api_error', 'fake_outage', 'The local fake was told to fail this request once.');
        const route = routes.find((r) => r.method === method && r.pattern.test(path));
        if (!route) throw new FakeError(404, 'invalid_request_error', 'resource_missing', `Unrecognized request URL (${method}: ${path}).`);
        const stripeAccount = typeof req.headers['stripe-account'] === 'string' ? req.headers['stripe-account'] : undefined;
        const key = typeof req.headers['idempotency-key'] === 'string' ? req.headers['idempotency-key'] : undefined;
        const scope = key && method === 'POST' ? `${stripeAccount ?? 'platform'}\u0000${key}` : undefined;
        const fingerprint = `${method} ${path} ${body}`;
        if (scope) {
          const seen = idempotency.get(scope);
          if (seen) {
            if (seen.fingerprint !== fingerprint) {
              throw new FakeError(400, 'idempotency_error', 'idempotency_key_in_use', `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}'.`);
            }
            stats.replays++;
            log(`replay ${method} ${path} (${key})`);
            return sendJson(res, seen.status, seen.body, { 'idempotent-replayed': 'true', ...(key ? { 'idempotency-key': key } : {}) });
          }
        }
        const params = method === 'POST' ? parseFormBody(body) : Object.fromEntries(url.searchParams);
        let status = 200;
        let out: string;
        try {
          out = JSON.stringify(route.handle(path.match(route.pattern) ?? ([] as unknown as RegExpMatchArray), params, stripeAccount));
        } catch (error) {
          if (!(error instanceof FakeError)) throw error;
          status = error.status;
          out = JSON.stringify({ error: { type: error.type, code: error.code, message: error.message, ...(error.param ? { param: error.param } : {}) } });
        }
        // The provider keeps the answer to an idempotent request, errors included (not 5xx).
        if (scope && status < 500) idempotency.set(scope, { fingerprint, status, body: out });
        if (method === 'POST') saveState();
        log(`${method} ${path} -> ${status}`);
        return sendJson(res, status, out, key ? { 'idempotency-key': key } : {});
      } catch (error) {
        const e = error instanceof FakeError ? error : new FakeError(500, 'api_error', 'fake_internal', (error as Error).message);
        return sendJson(res, e.status, JSON.stringify({ error: { type: e.type, code: e.code, message: e.message, ...(e.param ? { param: e.param } : {}) } }));
      }
    });
  });

  loadState();
  if (autoSettle) for (const { payout } of payouts.values()) if (payout.status === 'pending') scheduleSettle(payout.id);

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => resolve());
  });
  const port = (server.address() as AddressInfo).port;

  const api: PaymentsFake = {
    host: '127.0.0.1',
    port,
    url: `http://127.0.0.1:${port}`,
    secretKey: FAKE_SECRET_KEY,
    setWebhookUrl: (url) => {
      webhookUrl = url;
    },
    failTransfersFor: (id, message = 'The destination account cannot receive transfers (test failure).') => {
      failTransfers.set(id, message);
    },
    failPayoutsFor: (id, message = 'The bank account has been closed (test failure).') => {
      failPayouts.set(id, message);
    },
    clearFailures: (id) => {
      failTransfers.delete(id);
      failPayouts.delete(id);
    },
    failNextRequest: (method, path) => {
      failNext.add(`${method.toUpperCase()} ${path}`);
    },
    completeOnboarding: (id) => {
      const account = accountObject(id);
      account.details_submitted = true;
      account.payouts_enabled = true;
      account.capabilities = { transfers: 'active' };
      account.external_accounts = { object: 'list', data: [{ id: newId('ba'), object: 'bank_account', bank_name: 'Fake Test Bank', last4: '6789', currency: 'gbp' }], has_more: false };
      saveState();
    },
    settleAll: async () => {
      for (const t of timers) clearTimeout(t);
      timers.clear();
      for (const id of payouts.keys()) settle(id);
      while (deliveries.size > 0) await Promise.all(deliveries);
    },
    stats: () => structuredClone(stats),
    paidOutTo: (id) => {
      const out: Record<string, number> = {};
      for (const { payout, account } of payouts.values()) {
        if (account === id && payout.status === 'paid') out[payout.currency] = (out[payout.currency] ?? 0) + payout.amount;
      }
      return out;
    },
    balanceOf: (id) => Object.fromEntries(balance(id)),
    stop: async () => {
      for (const t of timers) clearTimeout(t);
      timers.clear();
      await Promise.allSettled(deliveries);
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
    },
  };
  return api;
}
