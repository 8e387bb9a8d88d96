import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { noSession, renderApp, stubFetch } from '../app/render-app';

describe('password reset pages', () => {
  it('asks for a reset link for the given address, pointing back to /reset-password', async () => {
    const { calls } = stubFetch({ 'GET /api/me': noSession, 'POST /api/auth/request-password-reset': { body: { status: true } } });
    const user = userEvent.setup();
    renderApp('/forgot-password');
    await user.type(await screen.findByLabelText('E-mail'), 'Setter@Demo.Squarewright.test');
    await user.click(screen.getByRole('button', { name: 'Send the link' }));
    expect(await screen.findByText('Check your mail')).toBeTruthy();
    expect(calls.find((c) => c.path === '/api/auth/request-password-reset')?.body).toEqual({
      email: 'setter@demo.squarewright.test',
      redirectTo: '/reset-password',
    });
  });

  it('refuses a reset link without a token', async () => {
    stubFetch({ 'GET /api/me': noSession });
    renderApp('/reset-password');
    expect(await screen.findByText('This link cannot be used')).toBeTruthy();
    expect(screen.queryByLabelText('New password')).toBeNull();
  });

  it('sets the new password with the token from the link, after checking both fields agree', async () => {
    const { calls } = stubFetch({ 'GET /api/me': noSession, 'POST /api/auth/reset-password': { body: { status: true } } });
    const user = userEvent.setup();
    renderApp('/reset-password?token=abc123');
    await user.type(await screen.findByLabelText('New password'), 'a-new-long-password');
    await user.type(screen.getByLabelText('New password, again'), 'a-new-long-passwore');
    await user.click(screen.getByRole('button', { name: 'Set the password' }));
    expect(await screen.findByText('does not match the new password')).toBeTruthy();
    expect(calls.some((c) => c.path === '/api/auth/reset-password')).toBe(false);

    await user.clear(screen.getByLabelText('New password, again'));
    await user.type(screen.getByLabelText('New password, again'), 'a-new-long-password');
    await user.click(screen.getByRole('button', { name: 'Set the password' }));
    expect(await screen.findByText('Password changed')).toBeTruthy();
    expect(calls.find((c) => c.path === '/api/auth/reset-password')?.body).toEqual({ token: 'abc123', newPassword: 'a-new-long-password' });
  });
});
