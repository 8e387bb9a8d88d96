import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { meAs, renderApp, stubFetch } from '../app/render-app';

const key = {
  id: 'k1',
  name: 'web team feed',
  start: 'sqw_Abc1',
  scopes: ['editions:read'],
  owner: { id: 'u1', name: 'Edwin Thorne', email: 'editor@demo.squarewright.test' },
  createdAt: '2026-12-04T09:00:00.000Z',
  expiresAt: '2027-03-04T09:00:00.000Z',
  lastUsedAt: null,
  ratePerMinute: 600,
  status: 'active',
};

describe('API keys page', () => {
  it('makes a key with the chosen scopes and shows its secret once, with a curl line', async () => {
    const secret = `sqw_${'A'.repeat(48)}`;
    let listed: unknown[] = [];
    const { calls } = stubFetch({
      'GET /api/me': meAs('editor'),
      'GET /api/api-keys': () => ({ body: { items: listed } }),
      'POST /api/api-keys': () => {
        listed = [key];
        return { status: 201, body: { apiKey: key, secret } };
      },
    });
    renderApp('/api-keys');
    expect(await screen.findByText('No API keys yet')).toBeTruthy();
    const user = userEvent.setup();
    await user.click(screen.getAllByRole('button', { name: 'Make an API key' })[0]!);
    await user.type(screen.getByLabelText(/^Name/), 'web team feed');
    await user.click(screen.getByLabelText(/editions:read/));
    await user.clear(screen.getByLabelText(/Expires after/));
    await user.type(screen.getByLabelText(/Expires after/), '30');
    await user.click(screen.getByRole('button', { name: 'Make the key' }));
    expect((await screen.findByLabelText('secret')).textContent).toBe(secret);
    expect(screen.getByText(/curl -H "Authorization: Bearer/).textContent).toContain('/api/feed/editions');
    const post = calls.find((c) => c.method === 'POST' && c.path === '/api/api-keys');
    expect(post?.body).toEqual({ name: 'web team feed', scopes: ['editions:read'], expiresInDays: 30 });
    // the list never carries the secret; once dismissed it is gone
    await user.click(screen.getByRole('button', { name: 'I have copied it' }));
    await waitFor(() => expect(screen.queryByLabelText('secret')).toBeNull());
    expect(await screen.findByText('sqw_Abc1…')).toBeTruthy();
    expect(document.body.textContent).not.toContain(secret);
  });

  it('revokes a key after confirming', async () => {
    const { calls } = stubFetch({
      'GET /api/me': meAs('editor'),
      'GET /api/api-keys': { body: { items: [key] } },
      'POST /api/api-keys/k1/revoke': { body: { ...key, status: 'revoked' } },
    });
    renderApp('/api-keys');
    const user = userEvent.setup();
    await user.click(await screen.findByRole('button', { name: 'Revoke' }));
    await user.click(await screen.findByRole('button', { name: 'Revoke the key' }));
    await waitFor(() => expect(calls.some((c) => c.method === 'POST' && c.path === '/api/api-keys/k1/revoke')).toBe(true));
  });
});
