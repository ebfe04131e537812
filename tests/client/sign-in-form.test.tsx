import { screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { SignInForm } from '../../client/src/features/auth/components/sign-in-form';
import { json, requests, stubFetch } from './support/fetch-stub';
import { aUser } from './support/fixtures';
import { renderWithProviders } from './support/render';

const USER = aUser('engineer', 'Ines Okafor', 'ines.okafor@example.test');

async function signIn(email: string, password: string) {
  const onSignedIn = vi.fn();
  const { user } = renderWithProviders(<SignInForm onSignedIn={onSignedIn} />);
  await user.type(screen.getByLabelText('E-mail'), email);
  await user.type(screen.getByLabelText('Password'), password);
  await user.click(screen.getByRole('button', { name: 'Sign in' }));
  return onSignedIn;
}

describe('sign-in form', () => {
  it('posts the credentials as JSON with the CSRF header and shows the server error', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 'pre-login-token' }),
      'POST /api/auth/login': json(401, { error: { code: 'invalid_credentials', message: 'E-mail or password is not right.' } }),
    });
    const onSignedIn = await signIn('Ines.Okafor@example.test ', 'not-the-password');

    expect((await screen.findByRole('alert')).textContent).toContain('E-mail or password is not right.');
    const login = requests(fetchMock).find((c) => c.key === 'POST /api/auth/login');
    expect(login?.headers['x-csrf-token']).toBe('pre-login-token');
    expect(login?.headers['content-type']).toBe('application/json');
    expect(login?.credentials).toBe('same-origin');
    // The shared login schema trims and lower-cases the address before it is sent.
    expect(login?.body).toEqual({ email: 'ines.okafor@example.test', password: 'not-the-password' });
    expect(onSignedIn).not.toHaveBeenCalled();
  });

  it('shows the rate limiter message on 429', async () => {
    stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'POST /api/auth/login': json(429, { error: { code: 'rate_limited', message: 'Too many sign-in attempts. Wait 15 minutes.' } }),
    });
    await signIn(USER.email, 'whatever1');
    expect((await screen.findByRole('alert')).textContent).toContain('Too many sign-in attempts. Wait 15 minutes.');
  });

  it('hands over the signed-in user', async () => {
    stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'POST /api/auth/login': json(200, { user: USER, csrfToken: 'session-token' }),
    });
    const onSignedIn = await signIn(USER.email, 'correct-horse');
    await vi.waitFor(() => expect(onSignedIn).toHaveBeenCalledWith(USER));
  });

  it('checks the fields before asking the server', async () => {
    const fetchMock = stubFetch({});
    await signIn('not-an-address', 'x');
    expect(await screen.findByText('a valid e-mail address')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });
});
