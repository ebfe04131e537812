import { csrfSync } from 'csrf-sync';

/**
 * Synchroniser-token CSRF protection (OWASP): the token lives in the session and every
 * state-changing request carries it in the `x-csrf-token` header.
 */
export const csrf = csrfSync({
  getTokenFromRequest: (req) => req.headers['x-csrf-token'] as string | undefined,
  errorConfig: { statusCode: 403, message: 'invalid csrf token', code: 'EBADCSRFTOKEN' },
});
