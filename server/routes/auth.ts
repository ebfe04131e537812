import type { RequestHandler } from 'express';
import type { PassportStatic } from 'passport';
import { changePasswordInput, loginInput } from '../../shared/schemas/users';
import { csrf } from '../auth/csrf';
import { hashPassword, verifyPassword } from '../auth/passwords';
import { SESSION_COOKIE } from '../auth/session';
import { HttpError, badRequest } from '../http/errors';
import { route } from '../http/route';
import type { User } from '../models/user';
import { audit } from '../services/audit';

export interface AuthDeps {
  passport: PassportStatic;
  loginLimiter: RequestHandler[];
  /** Called after sign-out so live connections of that session close too. */
  onSignOut?: (sessionId: string) => void;
  /** Ends a user's sessions (all but `exceptSid`) and closes their live connections. */
  endSessionsOf: (userId: number, exceptSid?: string) => Promise<void>;
}

export const authRoutes = ({ passport, loginLimiter, onSignOut, endSessionsOf }: AuthDeps) => [
  route({
    method: 'get',
    path: '/api/auth/csrf',
    access: 'public',
    summary: 'A CSRF token for this session',
    handler: ({ req }) => ({ csrfToken: csrf.generateToken(req) }),
  }),
  route({
    method: 'post',
    path: '/api/auth/login',
    access: 'public',
    summary: 'Sign in with e-mail and password',
    status: 200,
    before: loginLimiter,
    body: loginInput,
    handler: ({ req, body }) =>
      new Promise((resolve, reject) => {
        req.body = body;
        passport.authenticate('local', (err: unknown, user: User | false) => {
          if (err) return reject(err);
          if (!user) return reject(new HttpError(401, 'invalid_credentials', 'E-mail or password is not correct.'));
          // passport regenerates the session id here (session fixation).
          req.login(user, async (loginErr) => {
            if (loginErr) return reject(loginErr);
            req.session.signedInAt = Date.now();
            await user.update({ lastLoginAt: new Date() });
            resolve({ user: user.toDto(), csrfToken: csrf.generateToken(req, true) });
          });
        })(req, req.res, reject);
      }),
  }),
  route({
    method: 'get',
    path: '/api/auth/me',
    access: 'signed-in',
    summary: 'The signed-in user',
    handler: ({ req, user }) => ({ user: user!.toDto(), csrfToken: csrf.generateToken(req) }),
  }),
  route({
    method: 'post',
    path: '/api/auth/logout',
    access: 'signed-in',
    summary: 'Sign out and end the session',
    handler: ({ req, res }) =>
      new Promise<undefined>((resolve, reject) => {
        const sid = req.sessionID;
        req.logout((err) => {
          if (err) return reject(err);
          req.session.destroy((destroyErr) => {
            if (destroyErr) return reject(destroyErr);
            onSignOut?.(sid);
            res.clearCookie(SESSION_COOKIE);
            resolve(undefined);
          });
        });
      }),
  }),
  route({
    method: 'post',
    path: '/api/auth/password',
    access: 'signed-in',
    summary: 'Change my password (ends my other sessions)',
    body: changePasswordInput,
    handler: async ({ user, body, req }) => {
      if (!(await verifyPassword(user!.passwordHash, body.currentPassword))) throw badRequest('currentPassword: not correct', 'currentPassword');
      await user!.update({ passwordHash: await hashPassword(body.newPassword) });
      await endSessionsOf(user!.id, req.sessionID);
      await audit({ userId: user!.id, entity: 'user', entityId: user!.id, action: 'password-changed' });
      return undefined;
    },
  }),
];
