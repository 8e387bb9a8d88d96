import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { meAs, noSession, renderApp, stubFetch } from '../app/render-app';

// The server answers /api/auth/* errors in our envelope and words (server/platform/http/
// auth-endpoint.ts); the page must show the server's message as it came.
const wrongPassword = { status: 401, body: { error: { code: 'unauthorized', message: 'The e-mail address or the password is not right.' } } };

describe('the sign-in page', () => {
  it('shows the server’s error when the password is wrong, and stays on sign-in', async () => {
    const { calls } = stubFetch({
      'GET /api/me': noSession,
      'GET /api/public/config': { body: { demo: false } },
      'POST /api/auth/sign-in/email': wrongPassword,
    });
    const user = userEvent.setup();
    const { router } = renderApp('/sign-in');
    await user.type(await screen.findByLabelText('E-mail'), 'editor@demo.squarewright.test');
    await user.type(screen.getByLabelText('Password'), 'not-it');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('Sign-in failed');
    expect(alert.textContent).toContain('The e-mail address or the password is not right.');
    expect(router.state.location.pathname).toBe('/sign-in');
    const sent = calls.find((c) => c.path === '/api/auth/sign-in/email');
    expect(sent?.body).toMatchObject({ email: 'editor@demo.squarewright.test', password: 'not-it' });
  });

  it('checks the fields before calling the server', async () => {
    const { calls } = stubFetch({ 'GET /api/me': noSession, 'GET /api/public/config': { body: { demo: false } } });
    const user = userEvent.setup();
    renderApp('/sign-in');
    await user.type(await screen.findByLabelText('E-mail'), 'not-an-address');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('must be an e-mail address')).toBeTruthy();
    expect(screen.getByText('is required')).toBeTruthy();
    expect(screen.getByLabelText('E-mail').getAttribute('aria-invalid')).toBe('true');
    expect(calls.some((c) => c.path.startsWith('/api/auth/'))).toBe(false);
  });

  it('after signing in goes to the page the visitor asked for', async () => {
    let signedIn = false;
    stubFetch({
      'GET /api/me': () => (signedIn ? meAs('editor') : noSession),
      'GET /api/public/config': { body: { demo: false } },
      'POST /api/auth/sign-in/email': () => {
        signedIn = true;
        return { body: { redirect: false, token: 't', user: meAs('editor').body.user } };
      },
    });
    const user = userEvent.setup();
    const { router } = renderApp('/sign-in?next=%2Fstock');
    await user.type(await screen.findByLabelText('E-mail'), 'editor@demo.squarewright.test');
    await user.type(screen.getByLabelText('Password'), 'squarewright-demo');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/stock'));
    expect(await screen.findByRole('heading', { level: 1, name: 'Stock' })).toBeTruthy();
  });

  it('ignores a next address on another site', async () => {
    let signedIn = false;
    stubFetch({
      'GET /api/me': () => (signedIn ? meAs('setter') : noSession),
      'GET /api/public/config': { body: { demo: false } },
      'POST /api/auth/sign-in/email': () => {
        signedIn = true;
        return { body: { redirect: false, token: 't', user: meAs('setter').body.user } };
      },
    });
    const user = userEvent.setup();
    const { router } = renderApp('/sign-in?next=%2F%2Fevil.example%2F');
    await user.type(await screen.findByLabelText('E-mail'), 'setter@demo.squarewright.test');
    await user.type(screen.getByLabelText('Password'), 'squarewright-demo');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/'));
  });

  it('lists the demo accounts and password only in demo mode', async () => {
    stubFetch({
      'GET /api/me': noSession,
      'GET /api/public/config': {
        body: { demo: true, demoAccounts: [{ email: 'printer@demo.squarewright.test', role: 'printer' }], demoPassword: 'squarewright-demo' },
      },
    });
    const first = renderApp('/sign-in');
    const region = await screen.findByRole('region', { name: 'Demo accounts' });
    expect(region.textContent).toContain('printer@demo.squarewright.test');
    expect(region.textContent).toContain('squarewright-demo');
    first.unmount();

    stubFetch({ 'GET /api/me': noSession, 'GET /api/public/config': { body: { demo: false } } });
    renderApp('/sign-in');
    await screen.findByRole('heading', { level: 1, name: 'Sign in' });
    await waitFor(() => expect(screen.queryByRole('region', { name: 'Demo accounts' })).toBeNull());
    expect(screen.queryByText(/squarewright-demo/)).toBeNull();
  });
});
