import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request } from 'express';
import { csrfSync } from 'csrf-sync';

/** Cookie carrying the CSRF token before sign-in, so that no session is stored for anonymous visitors. */
export const PRE_SIGN_IN_COOKIE = 'sscope.pre';
// Per process: a token from before a restart is simply refused and the sign-in page asks for a new one.
const KEY = randomBytes(32);
const mac = (token: string) => createHmac('sha256', KEY).update(token).digest('base64url');

function preSignInToken(req: Request): string | undefined {
  const raw = (req.headers.cookie ?? '')
    .split(';')
    .map((c) => c.trim())
    .find((c) => c.startsWith(`${PRE_SIGN_IN_COOKIE}=`))
    ?.slice(PRE_SIGN_IN_COOKIE.length + 1);
  const [token, tag] = decodeURIComponent(raw ?? '').split('.');
  if (!token || !tag) return undefined;
  const expected = Buffer.from(mac(token));
  const given = Buffer.from(tag);
  return expected.length === given.length && timingSafeEqual(expected, given) ? token : undefined;
}

/**
 * Synchroniser-token CSRF protection (OWASP): every state-changing request carries the token in the
 * `x-csrf-token` header. Signed in, the token lives in the session; before sign-in it lives in a signed,
 * httpOnly cookie (an anonymous visitor gets no session row).
 */
export const csrf = csrfSync({
  getTokenFromRequest: (req) => req.headers['x-csrf-token'] as string | undefined,
  getTokenFromState: (req) => (req.user ? req.session.csrfToken : preSignInToken(req)),
  storeTokenInState: (req, token) => {
    if (req.user) req.session.csrfToken = token;
    else if (!token) req.res?.clearCookie(PRE_SIGN_IN_COOKIE, { path: '/api' });
    else req.res?.cookie(PRE_SIGN_IN_COOKIE, `${token}.${mac(token)}`, { httpOnly: true, sameSite: 'strict', secure: req.secure, path: '/api' });
  },
  errorConfig: { statusCode: 403, message: 'invalid csrf token', code: 'EBADCSRFTOKEN' },
});
