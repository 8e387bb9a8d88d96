import type { Browser, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { webhookDeliveryDetailSchema, webhookDeliveryPageSchema, webhookReceiptListResponseSchema } from '../../shared/contracts/integrations';
import { seriousAxeViolations } from './helpers/axe';
import { baseUrl, screenshot, signIn, useBrowser } from './helpers/browser';

// Integrations in a real browser (issue 18): an editor makes an API key on the API keys page,
// a script (plain fetch, no cookies, no Origin) uses it within its scopes, the secret is never
// shown again, its last use appears, and revoking it on the page refuses the script's very next
// request. An admin sees the demo's signed deliveries on the Webhooks page (the demo registers
// the local receiver first), sends one again by hand and sees the receiver catch it with a valid
// signature, and registers an endpoint whose signing secret is shown once.

/** What a script does: one request with the key and nothing else (no session, no Origin). */
async function script(key: string, method: 'GET' | 'POST', path: string, body?: unknown): Promise<{ status: number; code?: string }> {
  const init: RequestInit = { method, headers: { authorization: `Bearer ${key}`, ...(body ? { 'content-type': 'application/json' } : {}) } };
  if (body !== undefined) init.body = JSON.stringify(body);
  const res = await fetch(`${baseUrl()}${path}`, init);
  const json = (await res.json().catch(() => null)) as { error?: { code?: string } } | null;
  return { status: res.status, code: json?.error?.code };
}

/** A page whose context lets axe-core's injected script past the app's CSP (as reader.e2e does), with its console errors. */
async function openPage(browser: Browser): Promise<{ page: Page; errors: string[]; close: () => Promise<void> }> {
  const context = await browser.newContext({ baseURL: baseUrl(), viewport: { width: 1280, height: 860 }, bypassCSP: true });
  const page = await context.newPage();
  const errors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(`${page.url()}: ${m.text()}`);
  });
  page.on('pageerror', (e) => errors.push(`${page.url()}: uncaught ${e.message}`));
  return { page, errors, close: () => context.close() };
}

describe('integrations in the browser', () => {
  const harness = useBrowser();

  it('an editor makes a scoped key, a script uses it, the page shows its last use, and revoking it stops the next request', async () => {
    const { page, errors, close } = await openPage(harness.browser());
    try {
      await signIn(page, 'editor');
      await page.goto('/api-keys');
      await page.getByRole('heading', { name: 'API keys', level: 1 }).waitFor();
      const name = `e2e feed script ${Date.now()}`;

      await page.getByRole('button', { name: 'Make an API key' }).click();
      const dialog = page.getByRole('dialog', { name: 'Make an API key' });
      await dialog.getByLabel('Name').fill(name);
      await dialog.getByRole('checkbox', { name: /stock:read/ }).check();
      await dialog.getByRole('checkbox', { name: /editions:read/ }).check();
      await dialog.getByLabel('Expires after (days)').fill('7');
      await dialog.getByRole('button', { name: 'Make the key' }).click();
      await dialog.waitFor({ state: 'hidden' });

      const secretBox = page.getByLabel('secret');
      const secret = (await secretBox.innerText()).trim();
      expect(secret).toMatch(/^sqw_\S{20,}$/);
      // the curl line offered beside it reads the feed (the key has editions:read)
      await expect.poll(() => page.getByText(`Bearer ${secret}`).first().innerText()).toContain('/api/feed/editions');
      await screenshot(page, 'api-keys-new-key');
      expect(await seriousAxeViolations(page)).toEqual([]);

      // a script with the key: reads within its scopes, 403 outside them (a write, another scope)
      expect(await script(secret, 'GET', '/api/stock?pageSize=2')).toEqual({ status: 200, code: undefined });
      expect(await script(secret, 'GET', '/api/feed/editions?pageSize=1')).toEqual({ status: 200, code: undefined });
      expect(await script(secret, 'POST', '/api/puzzles', { stockId: '1', kind: 'assembly' })).toEqual({ status: 403, code: 'forbidden' });
      expect(await script(secret, 'GET', '/api/foundry/runs')).toEqual({ status: 403, code: 'forbidden' });

      // shown once: after "I have copied it" and a reload the secret is nowhere on the page
      await page.getByRole('button', { name: 'I have copied it' }).click();
      await page.reload();
      const row = page.getByRole('row').filter({ hasText: name });
      await row.waitFor();
      expect(await page.locator('body').innerText()).not.toContain(secret);
      await expect.poll(() => row.innerText()).toContain(secret.slice(0, 8));
      // its last use is shown (it was "not yet" before the script ran)
      expect(await row.innerText()).not.toContain('not yet');
      expect(await row.innerText()).toContain('Active');

      // revoke, after confirming: the script's very next request is refused
      await row.getByRole('button', { name: 'Revoke' }).click();
      await page.getByRole('dialog', { name: /^Revoke/ }).getByRole('button', { name: 'Revoke the key' }).click();
      await expect.poll(() => row.innerText()).toContain('Revoked');
      expect(await script(secret, 'GET', '/api/stock?pageSize=2')).toEqual({ status: 401, code: 'unauthorized' });
      await screenshot(page, 'api-keys-revoked');
      expect(errors).toEqual([]);
    } finally {
      await close();
    }
  }, 120_000);

  it('an admin sees the demo\u2019s signed deliveries, sends one again by hand, and registers an endpoint whose secret is shown once', async () => {
    const { page, errors, close } = await openPage(harness.browser());
    try {
      await signIn(page, 'admin');
      await page.goto('/admin/webhooks');
      await page.getByRole('heading', { name: 'Webhooks', level: 1 }).waitFor();

      // the demo registered the local receiver first; its deliveries arrive signed
      const endpoints = page.getByRole('table', { name: 'Endpoints', exact: true });
      await expect.poll(() => endpoints.innerText()).toContain('/api/webhooks/local-receiver');
      const deliveries = page.getByRole('table', { name: 'Deliveries', exact: true });
      await expect.poll(() => deliveries.innerText(), { timeout: 30_000 }).toContain('Delivered');
      const caught = page.getByRole('table', { name: 'Caught deliveries' });
      await expect.poll(() => caught.innerText(), { timeout: 30_000 }).toContain('Valid');
      expect(await caught.innerText()).not.toContain('Does not check');
      await screenshot(page, 'webhooks-demo');
      expect(await seriousAxeViolations(page)).toEqual([]);

      // the newest delivered delivery: its attempts, then "Send again now"; the receiver catches the same event again
      const page1 = webhookDeliveryPageSchema.parse(await (await page.request.get('/api/webhooks/deliveries?pageSize=25')).json());
      const index = page1.items.findIndex((d) => d.status === 'delivered');
      expect(index).toBeGreaterThanOrEqual(0);
      const newest = page1.items[index]!;
      const before = webhookReceiptListResponseSchema.parse(await (await page.request.get('/api/webhooks/local-receiver')).json()).items;
      const detailBefore = webhookDeliveryDetailSchema.parse(await (await page.request.get(`/api/webhooks/deliveries/${newest.id}`)).json());
      await deliveries.getByRole('row').nth(index + 1).getByRole('button', { name: 'Attempts' }).click();
      const drawer = page.getByRole('dialog', { name: `Delivery ${newest.id}` });
      await drawer.getByText(newest.eventType).first().waitFor();
      await expect.poll(() => drawer.innerText()).toContain(`"id": "${detailBefore.eventId}"`);
      await drawer.getByRole('button', { name: 'Send again now' }).click();
      const newestBefore = Math.max(0, ...before.map((r) => r.id));
      const caughtAgain = async () => webhookReceiptListResponseSchema.parse(await (await page.request.get('/api/webhooks/local-receiver')).json()).items.filter((r) => r.id > newestBefore && r.eventId === detailBefore.eventId);
      await expect.poll(async () => (await caughtAgain()).length, { timeout: 30_000 }).toBe(1);
      const again = (await caughtAgain())[0]!;
      expect(again.signatureValid).toBe(true);
      expect(JSON.parse(again.body)).toMatchObject({ id: detailBefore.eventId, type: newest.eventType });
      const detailAfter = webhookDeliveryDetailSchema.parse(await (await page.request.get(`/api/webhooks/deliveries/${newest.id}`)).json());
      expect(detailAfter.history.length).toBe(detailBefore.history.length + 1);
      await expect.poll(() => drawer.getByRole('table', { name: 'Attempts', exact: true }).getByRole('row').count(), { timeout: 30_000 }).toBe(detailAfter.history.length + 1);
      await screenshot(page, 'webhooks-delivery-drawer');
      await page.keyboard.press('Escape');
      await drawer.waitFor({ state: 'hidden' });

      // register an endpoint through the dialog: its signing secret is shown once
      const url = `https://desk.example.org/hooks/e2e-${Date.now()}`;
      await page.getByRole('button', { name: 'Register an endpoint' }).click();
      const dialog = page.getByRole('dialog', { name: 'Register an endpoint' });
      await dialog.getByLabel('URL').fill(url);
      await dialog.getByLabel('Description').fill('e2e: web team');
      await dialog.getByRole('button', { name: 'Register' }).click();
      await dialog.waitFor({ state: 'hidden' });
      const secret = (await page.getByLabel('secret').innerText()).trim();
      expect(secret).toMatch(/^whsq_\S{20,}$/);
      await expect.poll(() => endpoints.innerText()).toContain(url);
      await page.getByRole('button', { name: 'I have copied it' }).click();
      await page.reload();
      await endpoints.waitFor();
      expect(await page.locator('body').innerText()).not.toContain(secret);

      // paused and then removed (after confirming), so the demo server sends it nothing
      const row = endpoints.getByRole('row').filter({ hasText: url });
      await row.getByRole('button', { name: 'Pause' }).click();
      await expect.poll(() => row.innerText()).toContain('Paused');
      await row.getByRole('button', { name: 'Remove' }).click();
      await page.getByRole('dialog', { name: 'Remove this endpoint?' }).getByRole('button', { name: 'Remove the endpoint' }).click();
      await expect.poll(() => endpoints.innerText()).not.toContain(url);
      expect(errors).toEqual([]);
    } finally {
      await close();
    }
  }, 120_000);
});
