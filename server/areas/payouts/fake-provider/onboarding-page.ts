import { accountById, finishOnboarding } from './accounts';
import type { FakeContext } from './context';
import { nowSec } from './ids';
import type { Answer } from './http-server';

// The stand-in for the provider's hosted onboarding page (GET /connect/onboarding/:link).
// It collects nothing: submitting it finishes the account's onboarding with a test bank
// account, reports account.updated by webhook and sends the setter back to our return URL.
// An unknown or expired link answers 410, as the provider's does.

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function html(status: number, body: string): Answer {
  return { status, headers: { 'content-type': 'text/html; charset=utf-8' }, body };
}

export function onboardingPage(ctx: FakeContext, linkId: string, method: string): Answer {
  const link = ctx.state.links.get(linkId);
  if (!link || link.expiresAt < nowSec()) {
    return html(410, '<!doctype html><title>Link expired</title><p>This onboarding link has expired. Go back to Squarewright and start again.</p>');
  }
  const account = accountById(ctx.state, link.account);
  if (method === 'POST') {
    finishOnboarding(account);
    ctx.state.links.delete(linkId);
    ctx.save();
    ctx.webhooks.send('account.updated', account, account.id);
    return { status: 303, headers: { location: link.returnUrl }, body: '' };
  }
  return html(
    200,
    `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Local payments provider: payout details</title></head>
<body style="font-family: sans-serif; max-width: 36rem; margin: 3rem auto">
<h1>Local payments provider (test)</h1>
<p>This page stands in for the provider's hosted form where a setter enters bank details.
Nothing is collected here: submitting attaches a test bank account ending 6789 to ${escapeHtml(account.id)}.</p>
<form method="post"><button type="submit">Submit test bank details</button></form>
<p><a href="${escapeHtml(link.refreshUrl)}">Cancel</a></p></body></html>`,
  );
}
