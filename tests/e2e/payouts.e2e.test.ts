import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { waitForMail } from './helpers/mailbox';
import { demoAccount, screenshot, signIn, useBrowser } from './helpers/browser';

// Money in a real browser, against the local fake payments provider the server starts
// itself. The ledger entries come from the demo seeder (server/payments/demo-seed.ts):
// no demo edition is published end to end yet, so the demo setter's fees are seeded
// directly as fee entries. The flow: the setter adds payout details on the provider's
// (fake) hosted page, the editor runs a payout and sees it confirmed by the signed
// webhook, the setter sees it paid and mails herself a statement, which the admin finds
// in the Mailbox (local).

/** The card (a section) headed exactly `title`. */
function card(page: Page, title: string) {
  return page.locator('section').filter({ has: page.getByRole('heading', { name: title, exact: true }) }).first();
}

describe('payouts in the browser', () => {
  const harness = useBrowser();

  it('the setter adds payout details, the editor pays her, she sees it paid and gets her statement by mail', async () => {
    // 1. The setter: payout details through the provider's hosted page.
    const setter = harness.page();
    await signIn(setter, 'setter');
    await setter.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Earnings' }).click();
    await setter.getByRole('heading', { name: 'Earnings', level: 1 }).waitFor();
    expect(await setter.getByText('Fees paid to you may count as taxable income').count()).toBe(1);
    await setter.getByLabel('Country of your bank account').selectOption('GB');
    await setter.getByRole('button', { name: /payout details/ }).click();
    await setter.getByRole('button', { name: 'Submit test bank details' }).click();
    await setter.waitForURL(/\/earnings\?details=done/);
    const details = card(setter, 'Payout details');
    await expect.poll(() => details.innerText(), { timeout: 15_000 }).toContain('ending 6789');
    await screenshot(setter, 'earnings-details-ready');

    // 2. The editor: run a payout with confirmation; the webhook confirms it.
    const editorContext = await harness.newContext();
    const editor = await editorContext.newPage();
    await signIn(editor, 'editor');
    await editor.goto('/payouts');
    const { email: setterEmail } = await demoAccount('setter');
    const owedRow = editor.getByRole('row', { name: new RegExp(setterEmail.replace(/[.]/g, '\\.')) });
    await owedRow.waitFor();
    await editor.getByRole('button', { name: 'Run a payout…' }).click();
    const dialog = editor.getByRole('dialog', { name: 'Run a payout' });
    await dialog.waitFor();
    expect(await dialog.innerText()).toContain('tax');
    await dialog.getByRole('button', { name: /^Pay £/ }).click();
    await editor.getByText('Payout run started').waitFor();
    const runRow = editor.getByRole('row', { name: /Selma Quist/ }).filter({ has: editor.getByText(/Pending|Paid/) }).first();
    await expect.poll(() => runRow.innerText(), { timeout: 20_000 }).toContain('Paid');
    await screenshot(editor, 'payouts-paid');

    // 3. The setter sees the payment and mails herself a statement.
    await setter.goto('/earnings');
    const payouts = card(setter, 'Payouts to you');
    await expect.poll(() => payouts.innerText(), { timeout: 15_000 }).toContain('Paid');
    await setter.getByRole('button', { name: /^Mail me the statement/ }).first().click();
    const sent = setter.getByText(/Your statement for \d{4}-\d{2} is on its way/);
    await sent.waitFor();
    const month = /(\d{4}-\d{2})/.exec(await sent.innerText())?.[1] ?? '';
    await screenshot(setter, 'earnings-paid');

    // 4. The admin finds the statement in the Mailbox (local).
    const adminContext = await harness.newContext();
    const admin = await adminContext.newPage();
    await signIn(admin, 'admin');
    const mail = await waitForMail(admin.request, { to: setterEmail, subject: new RegExp(`statement for ${month}`) });
    expect(mail.text).toMatch(/Paid out to you this month: £|Earned this month: £/);
    await admin.goto(`/admin/mailbox/${mail.id}`);
    await admin.getByText(`statement for ${month}`).first().waitFor();
  }, 180_000);

  it('a printer sees none of it: the money API answers 403', async () => {
    const printer = harness.page();
    await signIn(printer, 'printer');
    for (const path of ['/api/payouts', '/api/earnings']) {
      const res = await printer.request.get(path);
      expect(res.status(), path).toBe(403);
    }
  }, 120_000);
});
