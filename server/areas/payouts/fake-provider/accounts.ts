import type { FakeContext } from './context';
import { noSuch } from './errors';
import { newId, nowSec } from './ids';
import { accountLinkParams, createAccountParams, parseParams, type FormFields } from './params';
import type { Account, FakeState } from './state';

// Connected accounts (one per setter) and the links to the provider's hosted onboarding
// page. A new account cannot receive transfers until its onboarding is finished, on the
// page (./onboarding-page.ts) or by completeOnboarding() in tests and the demo.

/** How long an onboarding link works (the provider's are short-lived too). */
const linkLifetimeSec = 300;

/** POST /v1/accounts */
export function createAccount(ctx: FakeContext, fields: FormFields): Account {
  const params = parseParams(createAccountParams, fields);
  const id = newId('acct');
  const account: Account = {
    id,
    object: 'account',
    type: params.type,
    country: params.country,
    email: params.email,
    metadata: params.metadata,
    created: nowSec(),
    details_submitted: false,
    payouts_enabled: false,
    charges_enabled: false,
    capabilities: { transfers: 'inactive' },
    external_accounts: { object: 'list', data: [], has_more: false, url: `/v1/accounts/${id}/external_accounts` },
  };
  ctx.state.accounts.set(id, account);
  ctx.stats.created.accounts++;
  return account;
}

/** GET /v1/accounts/:id, and every lookup of an account by id: 404 when the fake has none. */
export function accountById(state: FakeState, id: string): Account {
  const account = state.accounts.get(id);
  if (!account) throw noSuch('account', id, 'account');
  return account;
}

/** POST /v1/account_links: a link to the hosted onboarding page under `baseUrl`. */
export function createAccountLink(ctx: FakeContext, fields: FormFields, baseUrl: string): { object: 'account_link'; created: number; expires_at: number; url: string } {
  const params = parseParams(accountLinkParams, fields);
  const account = accountById(ctx.state, params.account).id;
  const id = newId('link');
  const expiresAt = nowSec() + linkLifetimeSec;
  ctx.state.links.set(id, { account, returnUrl: params.return_url, refreshUrl: params.refresh_url, expiresAt });
  ctx.stats.created.accountLinks++;
  return { object: 'account_link', created: nowSec(), expires_at: expiresAt, url: `${baseUrl}/connect/onboarding/${id}` };
}

/** What finishing the hosted page does: details submitted, payouts on, a test bank account ending 6789. */
export function finishOnboarding(account: Account): void {
  account.details_submitted = true;
  account.payouts_enabled = true;
  account.capabilities = { transfers: 'active' };
  account.external_accounts = {
    object: 'list',
    data: [{ id: newId('ba'), object: 'bank_account', bank_name: 'Fake Test Bank', last4: '6789', currency: 'gbp', country: account.country }],
    has_more: false,
    url: `/v1/accounts/${account.id}/external_accounts`,
  };
}
