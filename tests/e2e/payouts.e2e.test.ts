import type { APIRequestContext, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { editionListSchema, editionSchema, type Edition } from '../../shared/contracts/editions';
import { formatMoney } from '../../shared/contracts/ledger';
import { earningsSchema, payoutsOverviewSchema, type Earnings } from '../../shared/contracts/payouts';
import { publicationListSchema } from '../../shared/contracts/publications';
import { puzzleDetailSchema, puzzleStartedSchema } from '../../shared/contracts/puzzles';
import { stockDetailSchema } from '../../shared/contracts/stock';
import { submissionListSchema } from '../../shared/contracts/submissions';
import { waitForMail } from './helpers/mailbox';
import { baseUrl, demoAccount, screenshot, signIn, useBrowser } from './helpers/browser';

// Money in a real browser, from a publish to a paid statement (issue 8 item 5), against the
// local fake payments provider the server starts itself. The demo has The Saturday Quadrant
// No. 41 in proof; the printer approves it in the browser, the editor marks it published in
// the browser, and the fees of its puzzles whose tiling came from the demo setter go into
// the ledger. Then the setter adds payout details on the provider's (fake) hosted page, the
// editor runs a payout, the signed webhook marks it paid, the setter sees it paid and mails
// herself the statement, which the admin finds in the Mailbox (local).
//
// Setup through the API first, and why: the demo puzzles of No. 41 are made from demo stock
// tilings (provenance "demo", no setter), so publishing it as seeded would earn the setter
// nothing and the check "her owed amount grows by the fees" could not fail. So the test
// makes a Deduction puzzle from the tiling the demo setter submitted and the editor
// accepted (a demo submission), the printer returns proof 1 of No. 41, the editor adds the
// puzzle as a third slot and sends proof 2. No other e2e file needs No. 41 in proof; its
// first two slots stay as seeded (their solutions may print in No. 42).

/** The card (a section) headed exactly `title`. */
function card(page: Page, title: string) {
  return page.locator('section').filter({ has: page.getByRole('heading', { name: title, exact: true }) }).first();
}

async function json(request: APIRequestContext, method: 'GET' | 'POST' | 'PATCH', path: string, data?: unknown): Promise<unknown> {
  // a browser sends Origin with every state change; the app refuses one without it
  const res = await request.fetch(path, { method, data, headers: method === 'GET' ? {} : { origin: baseUrl() } });
  if (!res.ok()) throw new Error(`${method} ${path} answered ${res.status()}: ${await res.text()}`);
  return res.json();
}

async function edition(request: APIRequestContext, id: string): Promise<Edition> {
  return editionSchema.parse(await json(request, 'GET', `/api/editions/${id}`));
}

function owedGbp(e: Earnings): number {
  return e.owed.find((o) => o.currency === 'GBP')?.amountMinor ?? 0;
}

describe('payouts in the browser', () => {
  const harness = useBrowser();

  it('No. 41 is approved and published, the setter is owed its fees, the editor pays her, she sees it paid and gets her statement by mail', async () => {
    const setter = harness.page();
    await signIn(setter, 'setter');
    const editorContext = await harness.newContext();
    const editor = await editorContext.newPage();
    await signIn(editor, 'editor');
    const printerContext = await harness.newContext();
    const printer = await printerContext.newPage();
    await signIn(printer, 'printer');
    const { email: setterEmail } = await demoAccount('setter');
    const setterId = ((await json(setter.request, 'GET', '/api/me')) as { user: { id: string } }).user.id;

    // 0. Setup (see the top): a puzzle from the demo setter's accepted tiling, into No. 41.
    const { items: editions } = editionListSchema.parse(await json(editor.request, 'GET', '/api/editions'));
    const no41 = editions.find((e) => e.publicationTitle === 'The Saturday Quadrant' && e.number === 41);
    expect(no41?.state).toBe('in_proof');
    const id = no41!.id;
    const subs = submissionListSchema.parse(await json(editor.request, 'GET', '/api/submissions?status=accepted&sort=createdAt&pageSize=200'));
    const hers = subs.items.find((s) => s.setterId === setterId && s.stockId !== null);
    expect(hers, 'the demo has an accepted submission of the demo setter').toBeDefined();
    const started = puzzleStartedSchema.parse(await json(editor.request, 'POST', '/api/puzzles', { stockId: hers!.stockId, kind: 'deduction', level: 3 }));
    await expect
      .poll(async () => puzzleDetailSchema.parse(await json(editor.request, 'GET', `/api/puzzles/${started.id}`)).status, { timeout: 60_000, interval: 300 })
      .not.toBe('proving');
    const made = puzzleDetailSchema.parse(await json(editor.request, 'GET', `/api/puzzles/${started.id}`));
    expect(made.status).toBe('unique');
    expect(made.certificateCurrent).toBe(true);
    const v1 = (await edition(editor.request, id)).proofs.at(-1)!;
    expect(v1.status).toBe('pending');
    await json(printer.request, 'POST', `/api/editions/${id}/proofs/${v1.version}/return`, { notes: 'Room for one more puzzle in this column.' });
    const draft = await edition(editor.request, id);
    expect(draft.state).toBe('draft');
    const slots = [...draft.slots.map((s) => ({ puzzleId: s.puzzleId, instructions: s.instructions })), { puzzleId: String(made.id) }];
    await json(editor.request, 'PATCH', `/api/editions/${id}`, { slots });
    // the demo's half-scale Assembly pieces are under the column's 3 mm floor: sent with a reason, as the demo desk does
    const sent = editionSchema.parse(await json(editor.request, 'POST', `/api/editions/${id}/proofs`, { override: { reason: 'Test: the small pieces are cut from card.' } }));
    expect(sent.state).toBe('in_proof');
    const version = sent.proofs.at(-1)!.version;
    expect(version).toBe(v1.version + 1);

    // What publishing must earn her: the publication's fee for the kind of each puzzle of
    // No. 41 whose stock tiling has her as setter (read through the API).
    const pub = publicationListSchema.parse(await json(editor.request, 'GET', '/api/publications')).items.find((p) => p.id === sent.publicationId)!;
    let expectedFees = 0;
    const herPuzzles: string[] = [];
    for (const slot of sent.slots) {
      const p = puzzleDetailSchema.parse(await json(editor.request, 'GET', `/api/puzzles/${slot.puzzleId}`));
      const stock = stockDetailSchema.parse(await json(editor.request, 'GET', `/api/stock/${p.stockId}`));
      if (stock.setterId !== setterId) continue;
      herPuzzles.push(String(p.id));
      expectedFees += p.kind === 'assembly' ? pub.feeAssemblyMinor : pub.feeDeductionMinor;
    }
    expect(herPuzzles).toEqual([String(made.id)]);
    expect(expectedFees).toBeGreaterThan(0);

    // 1. The setter's owed amount before, on her Earnings page.
    const before = earningsSchema.parse(await json(setter.request, 'GET', '/api/earnings'));
    await setter.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Earnings' }).click();
    await setter.getByRole('heading', { name: 'Earnings', level: 1 }).waitFor();
    const owedCard = card(setter, 'Owed to you');
    await expect.poll(() => owedCard.innerText()).toContain(formatMoney(owedGbp(before), 'GBP'));

    // 2. The printer approves proof 2 of No. 41 in the browser.
    await printer.goto('/proofs');
    await printer.getByRole('link', { name: 'The Saturday Quadrant No. 41' }).click();
    await printer.getByRole('heading', { name: `Proof v${version}` }).waitFor();
    await printer.getByRole('button', { name: 'Approve for press' }).click();
    await printer.getByRole('dialog', { name: `Approve proof v${version} for press?` }).getByRole('button', { name: `Approve proof v${version}` }).click();
    await printer.getByText(/^Approved\./).waitFor({ timeout: 30_000 });

    // 3. The editor marks it published in the browser.
    await editor.goto(`/editions/${id}`);
    await editor.getByRole('heading', { name: 'The Saturday Quadrant No. 41', level: 1 }).waitFor({ timeout: 60_000 });
    await editor.getByRole('button', { name: 'Mark published' }).click();
    await editor.getByRole('dialog', { name: 'Publish No. 41?' }).getByRole('button', { name: 'Publish No. 41' }).click();
    await expect.poll(async () => (await edition(editor.request, id)).state, { timeout: 15_000 }).toBe('published');
    await editor.getByRole('button', { name: 'Mark published' }).waitFor({ state: 'detached' });
    await screenshot(editor, 'edition-published');

    // 4. The ledger gained exactly those fees: one entry per puzzle of hers, dated the edition's date.
    const after = earningsSchema.parse(await json(setter.request, 'GET', '/api/earnings'));
    expect(owedGbp(after) - owedGbp(before)).toBe(expectedFees);
    const gained = after.entries.filter((e) => !before.entries.some((b) => b.id === e.id));
    expect(gained.map((e) => ({ kind: e.kind, editionId: e.editionId, puzzleId: e.puzzleId, date: e.date, currency: e.currency })).sort((a, b) => (a.puzzleId! < b.puzzleId! ? -1 : 1))).toEqual(
      herPuzzles.map((puzzleId) => ({ kind: 'fee', editionId: id, puzzleId, date: sent.date, currency: 'GBP' })),
    );
    expect(gained.reduce((s, e) => s + e.amountMinor, 0)).toBe(expectedFees);
    await setter.reload();
    await expect.poll(() => owedCard.innerText(), { timeout: 15_000 }).toContain(formatMoney(owedGbp(after), 'GBP'));

    // 5. The setter: payout details through the provider's hosted page.
    expect(await setter.getByText('Fees paid to you may count as taxable income').count()).toBe(1);
    await setter.getByLabel('Country of your bank account').selectOption('GB');
    await setter.getByRole('button', { name: /payout details/ }).click();
    await setter.getByRole('button', { name: 'Submit test bank details' }).click();
    await setter.waitForURL(/\/earnings\?details=done/);
    const details = card(setter, 'Payout details');
    await expect.poll(() => details.innerText(), { timeout: 15_000 }).toContain('ending 6789');
    await screenshot(setter, 'earnings-details-ready');

    // 6. The editor: run a payout with confirmation, for what she is owed; the webhook confirms it.
    await editor.goto('/payouts');
    const owedRow = editor.getByRole('row', { name: new RegExp(setterEmail.replace(/[.]/g, '\\.')) });
    await owedRow.waitFor();
    await editor.getByRole('button', { name: 'Run a payout…' }).click();
    const dialog = editor.getByRole('dialog', { name: 'Run a payout' });
    await dialog.waitFor();
    expect(await dialog.innerText()).toContain('tax');
    // the demo's other setter was paid at seed time, so she is the only one with details and fees owed
    await dialog.getByRole('button', { name: `Pay ${formatMoney(owedGbp(after), 'GBP')}` }).click();
    await editor.getByText('Payout run started').waitFor();
    const runRow = editor.getByRole('row', { name: /Selma Quist/ }).filter({ has: editor.getByText(/Pending|Paid/) }).first();
    await expect.poll(() => runRow.innerText(), { timeout: 20_000 }).toContain('Paid');
    await screenshot(editor, 'payouts-paid');
    const overview = payoutsOverviewSchema.parse(await json(editor.request, 'GET', '/api/payouts'));
    const paid = overview.runs.flatMap((r) => r.payouts).filter((p) => p.setterId === setterId && p.state === 'paid');
    expect(paid.map((p) => p.amountMinor)).toEqual([owedGbp(after)]);
    expect(overview.owed.filter((o) => o.setterId === setterId)).toEqual([]);

    // 7. The setter sees the payment, and mails herself the statement of No. 41's month.
    await setter.goto('/earnings');
    const payouts = card(setter, 'Payouts to you');
    await expect.poll(() => payouts.innerText(), { timeout: 15_000 }).toContain('Paid');
    expect(await payouts.innerText()).toContain(formatMoney(owedGbp(after), 'GBP'));
    await expect.poll(() => owedCard.innerText()).toContain(formatMoney(0, 'GBP'));
    const month = sent.date.slice(0, 7);
    const monthName = new Intl.DateTimeFormat('en-GB', { month: 'long', year: 'numeric', timeZone: 'UTC' }).format(new Date(`${month}-01T00:00:00Z`));
    await setter.getByRole('button', { name: `Mail me the statement for ${monthName}` }).click();
    await setter.getByText(`Your statement for ${month} is on its way`).waitFor();
    await screenshot(setter, 'earnings-paid');

    // 8. The admin finds the statement in the Mailbox (local), listing the fee of No. 41.
    const adminContext = await harness.newContext();
    const admin = await adminContext.newPage();
    await signIn(admin, 'admin');
    const mail = await waitForMail(admin.request, { to: setterEmail, subject: new RegExp(`statement for ${month}`) });
    for (const e of gained) expect(mail.text).toContain(`${e.date}  fee, ${e.puzzleKind} ${e.puzzleId}  ${(e.amountMinor / 100).toFixed(2)} GBP`);
    const paidMonth = paid[0]!.paidAt!.slice(0, 7);
    expect(mail.text).toContain(`Paid out to you this month: ${paidMonth === month ? formatMoney(owedGbp(after), 'GBP') : 'nothing'}`);
    await admin.goto(`/admin/mailbox/${mail.id}`);
    await admin.getByText(`statement for ${month}`).first().waitFor();
  }, 240_000);

  it('a printer sees none of it: the money API answers 403', async () => {
    const printer = harness.page();
    await signIn(printer, 'printer');
    for (const path of ['/api/payouts', '/api/earnings']) {
      const res = await printer.request.get(path);
      expect(res.status(), path).toBe(403);
    }
  }, 120_000);
});
