import connectSessionSequelize from 'connect-session-sequelize';
import type { RequestHandler } from 'express';
import session from 'express-session';
import type { Sequelize } from 'sequelize';
import type { ServerConfig } from '../config';

declare module 'express-session' {
  interface SessionData {
    /** When the user signed in (ms since epoch), for the absolute timeout. */
    signedInAt?: number;
  }
}

export const SESSION_COOKIE = 'sscope.sid';

/** Sessions stored in MariaDB; rolling idle timeout on the cookie, absolute timeout checked per request. */
export function createSessionMiddleware(sequelize: Sequelize, config: ServerConfig) {
  const SequelizeStore = connectSessionSequelize(session.Store);
  const store = new SequelizeStore({
    db: sequelize,
    table: 'Session',
    checkExpirationInterval: 15 * 60_000,
    expiration: config.sessionIdleMs,
  });
  const middleware = session({
    name: SESSION_COOKIE,
    secret: config.sessionSecret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: { httpOnly: true, sameSite: 'lax', secure: config.secureCookies, maxAge: config.sessionIdleMs },
  });
  const absoluteTimeout: RequestHandler = (req, _res, next) => {
    const at = req.session?.signedInAt;
    if (at && Date.now() - at > config.sessionAbsoluteMs) {
      // A fresh, empty session: the user is signed out and must sign in again.
      return req.session.regenerate(next);
    }
    next();
  };
  return { middleware, absoluteTimeout, store };
}
