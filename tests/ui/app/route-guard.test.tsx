import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { canOpen } from '../../../src/app/role-guard';
import { meAs, noSession, renderApp, stubFetch } from './render-app';

describe('the route guard', () => {
  it('sends a visitor without a session to sign in, remembering where they were going', async () => {
    stubFetch({ 'GET /api/me': noSession, 'GET /api/public/config': { body: { demo: false } } });
    const { router } = renderApp('/stock?order=13');
    expect(await screen.findByRole('heading', { level: 1, name: 'Sign in' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(router.state.location.search).toBe(`?next=${encodeURIComponent('/stock?order=13')}`);
  });

  it('shows a setter who opens an editor page that it is not for their role, and no editor content', async () => {
    stubFetch({ 'GET /api/me': meAs('setter') });
    renderApp('/stock');
    expect(await screen.findByRole('heading', { level: 1, name: 'Not available for your role' })).toBeTruthy();
    expect(screen.queryByRole('heading', { name: 'Stock' })).toBeNull();
  });

  it('hides the admin Users page from an editor but opens it for an admin', async () => {
    stubFetch({ 'GET /api/me': meAs('editor') });
    const first = renderApp('/admin/users');
    expect(await screen.findByRole('heading', { level: 1, name: 'Not available for your role' })).toBeTruthy();
    first.unmount();

    const { calls } = stubFetch({
      'GET /api/me': meAs('admin'),
      'GET /api/admin/users': {
        body: {
          users: [
            { id: 'u1', email: 'editor@demo.squarewright.test', name: 'Demo editor', role: 'editor', active: true, createdAt: '2026-11-30T09:00:00.000Z' },
          ],
        },
      },
    });
    renderApp('/admin/users');
    expect(await screen.findByRole('heading', { level: 1, name: 'Users' })).toBeTruthy();
    expect(await screen.findByText('Demo editor')).toBeTruthy();
    expect(calls.some((c) => c.path === '/api/admin/users')).toBe(true);
  });

  it('canOpen allows exactly the listed roles', () => {
    expect(canOpen('admin', ['editor', 'admin'])).toBe(true);
    expect(canOpen('printer', ['editor', 'admin'])).toBe(false);
  });

  it('an unknown address inside the app shows the not-found page', async () => {
    stubFetch({ 'GET /api/me': meAs('editor') });
    renderApp('/no-such-page');
    expect(await screen.findByRole('heading', { level: 1, name: 'Page not found' })).toBeTruthy();
  });
});

describe('an expired session', () => {
  it('sends the user to sign in when a page’s data is answered 401, and back after', async () => {
    stubFetch({
      'GET /api/me': meAs('admin'),
      'GET /api/admin/users': { status: 401, body: { error: { code: 'unauthorized', message: 'Sign in first' } } },
      'GET /api/public/config': { body: { demo: false } },
    });
    const { router } = renderApp('/admin/users');
    expect(await screen.findByRole('heading', { level: 1, name: 'Sign in' })).toBeTruthy();
    expect(router.state.location.search).toBe(`?next=${encodeURIComponent('/admin/users')}`);
  });
});

describe('a page whose data is not what the contract says', () => {
  it('refuses the answer and says so inside the layout, keeping the navigation', async () => {
    stubFetch({
      'GET /api/me': meAs('admin'),
      // not the contract's shape: the page's fetcher must refuse it and the page must say so
      'GET /api/mailbox': { body: { messages: 'nope' } },
    });
    renderApp('/admin/mailbox');
    expect(await screen.findByText('Could not read the mailbox')).toBeTruthy();
    expect(screen.getByRole('navigation', { name: 'Main' })).toBeTruthy();
  });
});
