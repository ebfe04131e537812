import { describe, expect, it } from 'vitest';
import { ApiError, createApiClient } from '../../client/src/lib/api-client';
import { json, requests, stubFetch } from './support/fetch-stub';

const csrfInvalid = () => json(403, { error: { code: 'csrf_invalid', message: 'The form expired; reload and try again.' } });

describe('api client', () => {
  it('fetches a CSRF token before the first write and sends it as x-csrf-token', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 'tok-1' }),
      'POST /api/projects': json(201, { id: 7 }),
    });
    const api = createApiClient();
    await expect(api.post('/api/projects', { code: 'HV-07' })).resolves.toEqual({ id: 7 });
    const [csrf, post] = requests(fetchMock);
    expect(csrf.key).toBe('GET /api/auth/csrf');
    expect(post.headers['x-csrf-token']).toBe('tok-1');
    expect(post.headers['content-type']).toBe('application/json');
    expect(post.credentials).toBe('same-origin');
    expect(post.body).toEqual({ code: 'HV-07' });
  });

  it('on csrf_invalid fetches a fresh token and retries the write once', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': [json(200, { csrfToken: 'stale' }), json(200, { csrfToken: 'fresh' })],
      'PATCH /api/projects/3': [csrfInvalid(), json(200, { id: 3, name: 'North terrace' })],
    });
    const api = createApiClient();
    await expect(api.patch('/api/projects/3', { name: 'North terrace' })).resolves.toEqual({ id: 3, name: 'North terrace' });
    const calls = requests(fetchMock);
    expect(calls.map((c) => c.key)).toEqual(['GET /api/auth/csrf', 'PATCH /api/projects/3', 'GET /api/auth/csrf', 'PATCH /api/projects/3']);
    expect(calls[1].headers['x-csrf-token']).toBe('stale');
    expect(calls[3].headers['x-csrf-token']).toBe('fresh');
  });

  it('retries only once: a second csrf_invalid reaches the caller', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 'tok' }),
      'DELETE /api/plans/9': csrfInvalid(),
    });
    const error = await createApiClient()
      .delete('/api/plans/9')
      .catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).code).toBe('csrf_invalid');
    expect(requests(fetchMock).filter((c) => c.key === 'DELETE /api/plans/9')).toHaveLength(2);
  });

  it('does not retry other 403s, and keeps the server error code, message and field', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 'tok' }),
      'POST /api/users': json(403, { error: { code: 'forbidden', message: 'Only an admin may add users.', field: 'role' } }),
    });
    const error = (await createApiClient()
      .post('/api/users', {})
      .catch((e: unknown) => e)) as ApiError;
    expect([error.status, error.code, error.message, error.field]).toEqual([403, 'forbidden', 'Only an admin may add users.', 'role']);
    expect(fetchMock).toHaveBeenCalledTimes(2);
  });

  it('reads without a token and without asking for one', async () => {
    const fetchMock = stubFetch({ 'GET /api/projects': json(200, { items: [] }) });
    await createApiClient().get('/api/projects');
    const [call] = requests(fetchMock);
    expect(fetchMock).toHaveBeenCalledTimes(1);
    expect(call.headers['x-csrf-token']).toBeUndefined();
  });

  it('uses a token handed out at sign-in instead of fetching one', async () => {
    const fetchMock = stubFetch({ 'POST /api/auth/logout': new Response(null, { status: 204 }) });
    const api = createApiClient();
    api.rememberCsrfToken('from-login');
    await expect(api.post('/api/auth/logout')).resolves.toBeUndefined();
    expect(requests(fetchMock).map((c) => [c.key, c.headers['x-csrf-token']])).toEqual([['POST /api/auth/logout', 'from-login']]);
  });

  it('turns a plain-text rate-limit answer and a network failure into readable errors', async () => {
    stubFetch({ 'GET /api/projects': new Response('Too many requests, please try again later.', { status: 429 }) });
    const limited = (await createApiClient()
      .get('/api/projects')
      .catch((e: unknown) => e)) as ApiError;
    expect([limited.status, limited.message]).toEqual([429, 'Too many requests, please try again later.']);

    stubFetch({});
    const offline = (await createApiClient()
      .get('/api/projects')
      .catch((e: unknown) => e)) as ApiError;
    expect([offline.status, offline.code]).toEqual([0, 'network']);
  });
});
