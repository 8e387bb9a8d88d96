import { describe, expect, it } from 'vitest';
import { demoAccount, navLabels, screenshot, signIn, submitSignInForAnswer, useBrowser, type DemoRole } from './helpers/browser';

// The foundation in a real browser: each demo role signs in and sees its own navigation,
// a wrong password is refused with a message, and an invited person completes sign-up
// from the link in the mail the local fake SMTP server caught.
// Expected navigation: docs screens.md / issue 2 (the product's own specification).

const editorNav = ['Home', 'Review queue', 'Stock', 'Puzzles', 'Editions', 'Foundry', 'Payouts'];
const expectedNav: Record<DemoRole, string[]> = {
  setter: ['Home', 'Submit', 'My submissions', 'Earnings'],
  editor: editorNav,
  printer: ['Proofs', 'Press files'],
  admin: [...editorNav, 'Users', 'Publications', 'Templates', 'Mailbox (local)'],
};

describe('foundation in the browser', () => {
  const harness = useBrowser();

  for (const role of ['setter', 'editor', 'printer', 'admin'] as const) {
    it(`the ${role} demo account signs in and sees the ${role} navigation`, async () => {
      const page = harness.page();
      await signIn(page, role, { fresh: true });
      expect(await navLabels(page)).toEqual(expectedNav[role]);
      const { email } = await demoAccount(role);
      await expect.poll(() => page.getByRole('banner').innerText()).toContain(email);
      await screenshot(page, `home-${role}`);
    }, 120_000);
  }

  it('the sign-in page lists the demo accounts in demo mode', async () => {
    const page = harness.page();
    await page.goto('/sign-in');
    const demo = page.getByRole('region', { name: 'Demo accounts' });
    await demo.waitFor();
    const { email, password } = await demoAccount('editor');
    expect(await demo.innerText()).toContain(email);
    expect(await demo.innerText()).toContain(password);
    await screenshot(page, 'sign-in');
  });

  it('a wrong password is refused with a visible error and no session', async () => {
    const page = harness.page();
    const { email } = await demoAccount('editor');
    await page.goto('/sign-in');
    const answer = await submitSignInForAnswer(page, email, 'not-the-password-at-all');
    expect(answer.status()).toBe(401);
    const alert = page.getByRole('alert');
    await alert.waitFor();
    expect(await alert.innerText()).toMatch(/sign-in failed/i);
    expect(await alert.innerText()).toMatch(/invalid|incorrect|wrong/i);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    const me = await page.request.get('/api/me');
    expect(me.status()).toBe(401);
    await screenshot(page, 'sign-in-wrong-password');
  }, 120_000);

  it('an invited person completes sign-up from the link in the caught mail', async () => {
    const admin = harness.page();
    await signIn(admin, 'admin');
    const invitee = `new-setter-${Date.now()}@larkspur-quill.test`;

    await admin.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Users' }).click();
    await admin.getByRole('button', { name: 'Invite someone' }).click();
    const dialog = admin.getByRole('dialog', { name: 'Invite someone' });
    await dialog.getByLabel('E-mail').fill(invitee);
    await dialog.getByLabel('Role').selectOption('setter');
    await dialog.getByRole('button', { name: 'Send the invitation' }).click();
    await admin.getByText(`A sign-up link is on its way to ${invitee}`).waitFor();

    // Read the mail as admin through the API (same cookies as the page).
    let link: string | undefined;
    await expect
      .poll(
        async () => {
          const list = await admin.request.get('/api/mailbox');
          expect(list.status()).toBe(200);
          const { messages } = (await list.json()) as { messages: { id: number; to: string }[] };
          const mail = messages.find((m) => m.to.includes(invitee));
          if (!mail) return undefined;
          const detail = await admin.request.get(`/api/mailbox/${mail.id}`);
          const { message } = (await detail.json()) as { message: { text: string } };
          link = /https?:\/\/\S+\/invite\/[A-Za-z0-9_-]+/.exec(message.text)?.[0];
          return link;
        },
        { timeout: 20_000, interval: 300 },
      )
      .toBeDefined();

    const other = await harness.newContext();
    const page = await other.newPage();
    await page.goto(link ?? '');
    await page.getByText(invitee).waitFor();
    await page.getByLabel('Your name').fill('Wren Halloway');
    await page.getByLabel('Password', { exact: true }).fill('a-long-enough-secret');
    await page.getByLabel('Password, again').fill('a-long-enough-secret');
    await screenshot(page, 'accept-invitation');
    await page.getByRole('button', { name: 'Create my account' }).click();
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    expect(await navLabels(page)).toEqual(expectedNav.setter);
    expect(await page.getByRole('banner').innerText()).toContain('Wren Halloway');

    // The link works once.
    const again = await harness.newContext();
    const second = await again.newPage();
    await second.goto(link ?? '');
    await second.getByText('This invitation cannot be used').waitFor();
  });
});
