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
      'GET /api/invitations': { body: { invitations: [] } },
    });
    const user = userEvent.setup();
    renderApp('/admin/users');
    await screen.findByText('Edwin Thorne', {}, { timeout: 10_000 }); // the page is a lazy route

    await user.click(screen.getByRole('button', { name: 'Invite someone' }));
    const dialog = await screen.findByRole('dialog', { name: 'Invite someone' });
    await user.type(within(dialog).getByLabelText('E-mail'), 'Press.Room@Larkspur-Quill.test');
    await user.selectOptions(within(dialog).getByLabelText('Role'), 'printer');
    await user.click(within(dialog).getByRole('button', { name: 'Send the invitation' }));
    expect(await screen.findByText(/A sign-up link is on its way to press.room@larkspur-quill.test/)).toBeTruthy();
    expect(calls.find((c) => c.method === 'POST' && c.path === '/api/invitations')?.body).toEqual({ email: 'press.room@larkspur-quill.test', role: 'printer' });

    // a role change asks first, saying what the new role may do; cancelling changes nothing
    await user.selectOptions(screen.getByLabelText('Role of editor@demo.squarewright.test'), 'admin');
    let confirm = await screen.findByRole('dialog', { name: 'Change the role of Edwin Thorne?' });
    expect(confirm.textContent).toMatch(/manage users, invitations, roles/);
    await user.click(within(confirm).getByRole('button', { name: 'Cancel' }));
    expect(calls.filter((c) => c.method === 'PATCH')).toEqual([]);
    await user.selectOptions(screen.getByLabelText('Role of editor@demo.squarewright.test'), 'admin');
    confirm = await screen.findByRole('dialog', { name: 'Change the role of Edwin Thorne?' });
    await user.click(within(confirm).getByRole('button', { name: 'Make Edwin Thorne an admin' }));
    await waitFor(() => expect(calls.filter((c) => c.method === 'PATCH').map((c) => c.body)).toEqual([{ role: 'admin' }]));
    expect(await screen.findByText('Edwin Thorne is now an admin.')).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Deactivate editor@demo.squarewright.test' }));
    confirm = await screen.findByRole('dialog', { name: 'Deactivate Edwin Thorne?' });
    expect(confirm.textContent).toMatch(/signed out everywhere/);
    await user.click(within(confirm).getByRole('button', { name: 'Deactivate Edwin Thorne' }));
    await waitFor(() => expect(calls.filter((c) => c.method === 'PATCH').map((c) => c.body)).toEqual([{ role: 'admin' }, { active: false }]));
  });

  it('shows the server’s refusal when a change is not allowed', async () => {
    stubFetch({
      'GET /api/me': meAs('admin'),
      'GET /api/admin/users': { body: { users } },
      'PATCH /api/admin/users/u-ed': { status: 409, body: { error: { code: 'conflict', message: 'The last admin cannot be deactivated' } } },
      'GET /api/invitations': { body: { invitations: [] } },
    });
    const user = userEvent.setup();
    renderApp('/admin/users');
    await user.click(await screen.findByRole('button', { name: 'Deactivate editor@demo.squarewright.test' }, { timeout: 10_000 }));
    await user.click(within(await screen.findByRole('dialog', { name: 'Deactivate Edwin Thorne?' })).getByRole('button', { name: 'Deactivate Edwin Thorne' }));
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('The last admin cannot be deactivated');
  });

  it('lists pending invitations; resends one and revokes another after asking', async () => {
    const invitations = [
      { id: '00000000-0000-4000-8000-000000000001', email: 'late@larkspur-quill.test', role: 'setter', invitedByName: 'Demo admin', createdAt: '2026-11-20T09:00:00.000Z', expiresAt: '2026-11-27T09:00:00.000Z', expired: true },
      { id: '00000000-0000-4000-8000-000000000002', email: 'press@larkspur-quill.test', role: 'printer', invitedByName: null, createdAt: '2026-12-01T09:00:00.000Z', expiresAt: '2026-12-08T09:00:00.000Z', expired: false },
    ];
    const { calls } = stubFetch({
      'GET /api/me': meAs('admin'),
      'GET /api/admin/users': { body: { users } },
      'GET /api/invitations': { body: { invitations } },
      [`POST /api/invitations/${invitations[0]!.id}/resend`]: { body: { invitation: { ...invitations[0], expiresAt: '2026-12-11T09:00:00.000Z', expired: false } } },
      [`POST /api/invitations/${invitations[1]!.id}/revoke`]: { status: 204 },
    });
    const user = userEvent.setup();
    renderApp('/admin/users');
    const table = await screen.findByRole('table', { name: 'Pending invitations' }, { timeout: 10_000 });
    expect(within(table).getByText('Expired')).toBeTruthy();
    await user.click(within(table).getByRole('button', { name: 'Resend the invitation to late@larkspur-quill.test' }));
    expect(await screen.findByText(/A new link is on its way to late@larkspur-quill.test/)).toBeTruthy();
    await user.click(within(table).getByRole('button', { name: 'Revoke the invitation to press@larkspur-quill.test' }));
    const dialog = await screen.findByRole('dialog', { name: 'Revoke the invitation to press@larkspur-quill.test?' });
    await user.click(within(dialog).getByRole('button', { name: 'Revoke the invitation' }));
    await waitFor(() => expect(calls.filter((c) => c.method === 'POST').map((c) => c.path)).toEqual([`/api/invitations/${invitations[0]!.id}/resend`, `/api/invitations/${invitations[1]!.id}/revoke`]));
  });

  it('does not offer an admin to deactivate or demote themselves', async () => {
    stubFetch({
      'GET /api/me': meAs('admin'),
      'GET /api/invitations': { body: { invitations: [] } },
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
