import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { json, requests, stubFetch } from './support/fetch-stub';
import { aProject, aUser } from './support/fixtures';
import { renderApp } from './support/render';

const OPERATOR = aUser('operator', 'Tomás Reyes', 'tomas.reyes@example.test');
const PROJECT = aProject({ id: 3, code: 'HV-07', name: 'North terrace' });

describe('app routes', () => {
  it('sends a signed-out visitor to sign-in and back to the page they asked for', async () => {
    stubFetch({
      'GET /api/auth/me': [json(401, { error: { code: 'unauthenticated', message: 'Sign in first.' } })],
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'POST /api/auth/login': json(200, { user: OPERATOR, csrfToken: 'session' }),
      'GET /api/projects': json(200, { items: [PROJECT] }),
      'GET /api/health': json(200, { app: 'ok', database: 'ok' }),
    });
    const { router, user } = renderApp('/projects');

    await screen.findByRole('heading', { name: 'Sign in' });
    expect(router.state.location.search).toBe('?next=%2Fprojects');
    await user.type(screen.getByLabelText('E-mail'), OPERATOR.email);
    await user.type(screen.getByLabelText('Password'), 'a-long-password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    await screen.findByRole('heading', { name: 'Projects' });
    expect(router.state.location.pathname).toBe('/projects');
    expect(screen.getByRole('link', { name: 'HV-07' })).toBeTruthy();
    // An operator reads projects but does not create them, nor see the users page.
    expect(screen.queryByRole('link', { name: 'New project' })).toBeNull();
    expect(screen.queryByRole('link', { name: 'Users' })).toBeNull();
    // Cautions stand with results, not on a register of projects where they would become wallpaper.
    expect(screen.queryByText('A result applies to one plate at one spot and one depth.')).toBeNull();
  });

  it('signs out through the server and lands on a plain sign-in page', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/me': [json(200, { user: OPERATOR, csrfToken: 'session' }), json(401, { error: { code: 'unauthenticated', message: 'Sign in first.' } })],
      'GET /api/health': json(200, { app: 'ok', database: 'ok' }),
      'POST /api/auth/logout': new Response(null, { status: 204 }),
    });
    const { router, user } = renderApp('/account');
    await user.click(await screen.findByRole('button', { name: 'Sign out' }));

    await screen.findByRole('heading', { name: 'Sign in' });
    expect(router.state.location.pathname + router.state.location.search).toBe('/sign-in');
    const logout = requests(fetchMock).find((c) => c.key === 'POST /api/auth/logout');
    expect(logout?.headers['x-csrf-token']).toBe('session'); // the token the session check handed out
  });

  it('tells an operator the users page is not for their role', async () => {
    stubFetch({
      'GET /api/auth/me': json(200, { user: OPERATOR, csrfToken: 'session' }),
      'GET /api/health': json(503, { app: 'ok', database: 'down' }), // as the server answers when its database is down
    });
    renderApp('/users');
    expect(await screen.findByText('Your role cannot open this page')).toBeTruthy();
    // A database outage is said in words, not only in colour.
    expect(await screen.findByText('The database is down', { exact: false })).toBeTruthy();
  });
});
