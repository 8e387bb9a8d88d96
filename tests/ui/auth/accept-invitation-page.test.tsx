import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { meAs, noSession, renderApp, stubFetch } from '../app/render-app';

const token = 'tok_0123456789abcdefghijklmnop';

describe('accepting an invitation', () => {
  it('says so when the invitation was already used', async () => {
    stubFetch({
      'GET /api/me': noSession,
      [`GET /api/invitations/${token}`]: { body: { email: 'wren@larkspur-quill.test', role: 'setter', valid: false, reason: 'used' } },
    });
    renderApp(`/invite/${token}`);
    expect(await screen.findByText('This invitation cannot be used')).toBeTruthy();
    expect(screen.getByText(/already been used/)).toBeTruthy();
    expect(screen.queryByLabelText('Your name')).toBeNull();
  });

  it('checks the fields, sends name and password, and opens the new user’s home', async () => {
    let accepted = false;
    const { calls } = stubFetch({
      'GET /api/me': () => (accepted ? meAs('setter') : noSession),
      [`GET /api/invitations/${token}`]: { body: { email: 'wren@larkspur-quill.test', role: 'setter', valid: true } },
      [`POST /api/invitations/${token}/accept`]: () => {
        accepted = true;
        return { status: 201, body: meAs('setter').body };
      },
    });
    const user = userEvent.setup();
    const { router } = renderApp(`/invite/${token}`);
    expect(await screen.findByText('wren@larkspur-quill.test')).toBeTruthy();
    await user.type(screen.getByLabelText('Your name'), 'Wren Halloway');
    await user.type(screen.getByLabelText('Password'), 'short');
    await user.type(screen.getByLabelText('Password, again'), 'other');
    await user.click(screen.getByRole('button', { name: 'Create my account' }));
    expect(await screen.findByText('must be at least 10 characters')).toBeTruthy();
    expect(calls.some((c) => c.method === 'POST')).toBe(false);

    await user.clear(screen.getByLabelText('Password'));
    await user.type(screen.getByLabelText('Password'), 'long-enough-secret');
    await user.clear(screen.getByLabelText('Password, again'));
    await user.type(screen.getByLabelText('Password, again'), 'long-enough-secret');
    await user.click(screen.getByRole('button', { name: 'Create my account' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/'));
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ name: 'Wren Halloway', password: 'long-enough-secret' });
    expect(await screen.findByRole('navigation', { name: 'Main' })).toBeTruthy();
  });

  it('says a cut or mistyped link is not known without asking the server (no failed request in the console)', async () => {
    const { calls } = stubFetch({ 'GET /api/me': noSession, 'GET /api/session': { body: { user: null } } });
    renderApp('/invite/not-a-token');
    expect(await screen.findByText('This invitation link is not known.')).toBeTruthy();
    expect(calls.some((c) => c.path.startsWith('/api/invitations'))).toBe(false);
  });
});
