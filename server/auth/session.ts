import connectSessionSequelize from 'connect-session-sequelize';
import type { RequestHandler } from 'express';
import session from 'express-session';
import { Op, type Sequelize } from 'sequelize';
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

/**
 * Ends every stored session of a user except `exceptSid` (the one making the change, when it is theirs);
 * answers the session ids ended, so their live connections can be closed too. Used when the account's
 * role, state or password changes: the old sessions must not go on with the old rights.
 */
export async function endUserSessions(sequelize: Sequelize, userId: number, exceptSid?: string): Promise<string[]> {
  const Session = sequelize.models.Session;
  // passport keeps the user id in the session as {"passport":{"user":<id>}}; the LIKE narrows, the parse decides.
  const rows = await Session.findAll({ where: { data: { [Op.like]: `%"passport":{"user":${Math.trunc(userId)}}%` } }, attributes: ['sid', 'data'] });
  const sids = rows
    .map((r) => ({ sid: r.get('sid') as string, data: JSON.parse(String(r.get('data'))) as { passport?: { user?: unknown } } }))
    .filter((r) => r.data.passport?.user === userId && r.sid !== exceptSid)
    .map((r) => r.sid);
  if (sids.length) await Session.destroy({ where: { sid: sids } });
  return sids;
}
