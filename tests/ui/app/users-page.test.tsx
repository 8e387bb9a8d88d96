import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { meAs, renderApp, stubFetch } from './render-app';

const users = [
  { id: 'u-ed', email: 'editor@demo.squarewright.test', name: 'Edwin Thorne', role: 'editor', active: true, createdAt: '2026-11-30T09:00:00.000Z' },
];

describe('admin Users page', () => {
  it('invites with a role, changes a role and deactivates, sending what the contracts say', async () => {
    const { calls } = stubFetch({
      'GET /api/me': meAs('admin'),
      'GET /api/admin/users': { body: { users } },
      'POST /api/invitations': (call) => ({
        status: 201,
        body: { invitation: { id: 'i1', email: (call.body as { email: string }).email, role: 'printer', expiresAt: '2026-12-09T00:00:00.000Z' } },
      }),
      'PATCH /api/admin/users/u-ed': (call) => ({ body: { user: { ...users[0], ...(call.body as object) } } }),
    });
    const user = userEvent.setup();
    renderApp('/admin/users');
    await screen.findByText('Edwin Thorne');

    await user.click(screen.getByRole('button', { name: 'Invite someone' }));
    const dialog = await screen.findByRole('dialog', { name: 'Invite someone' });
    await user.type(within(dialog).getByLabelText('E-mail'), 'Press.Room@Larkspur-Quill.test');
    await user.selectOptions(within(dialog).getByLabelText('Role'), 'printer');
    await user.click(within(dialog).getByRole('button', { name: 'Send the invitation' }));
    expect(await screen.findByText(/A sign-up link is on its way to press.room@larkspur-quill.test/)).toBeTruthy();
    expect(calls.find((c) => c.path === '/api/invitations')?.body).toEqual({ email: 'press.room@larkspur-quill.test', role: 'printer' });

    await user.selectOptions(screen.getByLabelText('Role of editor@demo.squarewright.test'), 'admin');
    await waitFor(() => expect(calls.filter((c) => c.method === 'PATCH').map((c) => c.body)).toEqual([{ role: 'admin' }]));
    await user.click(screen.getByRole('button', { name: 'Deactivate editor@demo.squarewright.test' }));
    await waitFor(() => expect(calls.filter((c) => c.method === 'PATCH').map((c) => c.body)).toEqual([{ role: 'admin' }, { active: false }]));
  });

  it('shows the server’s refusal when a change is not allowed', async () => {
    stubFetch({
      'GET /api/me': meAs('admin'),
      'GET /api/admin/users': { body: { users } },
      'PATCH /api/admin/users/u-ed': { status: 409, body: { error: { code: 'conflict', message: 'The last admin cannot be deactivated' } } },
    });
    const user = userEvent.setup();
    renderApp('/admin/users');
    await user.click(await screen.findByRole('button', { name: 'Deactivate editor@demo.squarewright.test' }));
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('The last admin cannot be deactivated');
  });

  it('does not offer an admin to deactivate or demote themselves', async () => {
    stubFetch({
      'GET /api/me': meAs('admin'),
      'GET /api/admin/users': {
        body: { users: [...users, { id: 'u-admin', email: 'admin@demo.squarewright.test', name: 'Demo admin', role: 'admin', active: true, createdAt: '2026-11-30T09:00:00.000Z' }] },
      },
    });
    renderApp('/admin/users');
    await screen.findByText('Demo admin');
    expect(await screen.findByText('(you)')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Deactivate admin@demo.squarewright.test' })).toBeNull();
    expect((screen.getByLabelText('Role of admin@demo.squarewright.test') as HTMLSelectElement).disabled).toBe(true);
    expect(screen.getByRole('button', { name: 'Deactivate editor@demo.squarewright.test' })).toBeTruthy();
  });
});
