import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { type Express, type RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import helmet from 'helmet';
import type { Sequelize } from 'sequelize';
import { csrf } from './auth/csrf';
import { configurePassport } from './auth/passport';
import { createSessionMiddleware, endUserSessions } from './auth/session';
import type { ServerConfig } from './config';
import { HttpError, errorHandler } from './http/errors';
import { type RouteSpec, mount } from './http/route';
import { ags4Routes } from './routes/ags4';
import { authRoutes } from './routes/auth';
import { correctionRoutes } from './routes/corrections';
import { healthRoutes } from './routes/health';
import { importRoutes } from './routes/imports';
import { instrumentRoutes } from './routes/instruments';
import { mailboxRoutes } from './routes/mailbox';
import { interpretationRoutes } from './routes/interpretation';
import { planRoutes } from './routes/plans';
import { photoRoutes } from './routes/photos';
import { projectRoutes } from './routes/projects';
import { deviceProfileRoutes } from './routes/device-profiles';
import { rigRoutes } from './routes/rigs';
import { reportRoutes } from './routes/reports';
import { runRoutes } from './routes/runs';
import { signoffRoutes } from './routes/signoff';
import type { RunManager } from './runs/run-manager';
import type { DomainEvents } from './services/domain-events';
import { sitePlanRoutes } from './routes/site-plans';
import { userRoutes } from './routes/users';

export interface AppParts {
  app: Express;
  /** Every API route with its access rule: the permission-matrix test walks this table. */
  routes: RouteSpec[];
  /** Session + passport middleware, for sharing the session with socket.io. */
  sessionMiddleware: RequestHandler[];
  close(): void;
}

function loginLimiter(config: ServerConfig): RequestHandler[] {
  const message = { error: { code: 'rate_limited', message: 'Too many sign-in attempts; wait a few minutes and try again.' } };
  const common = { windowMs: config.loginWindowMs, standardHeaders: 'draft-8' as const, legacyHeaders: false, message, statusCode: 429 };
  return [
    // Per account and address: slows guessing one password.
    rateLimit({ ...common, limit: config.loginAttempts, keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : ''}` }),
    // Per address across accounts: slows spraying many accounts.
    rateLimit({ ...common, limit: config.loginAttempts * 5, keyGenerator: (req) => ipKeyGenerator(req.ip ?? '') }),
  ];
}

export interface AppDeps {
  runs: RunManager;
  /** Where sign-off publishes; the run manager's bus when not given. */
  events?: DomainEvents;
  onSignOut?: (sid: string) => void;
}

export function createApp(sequelize: Sequelize, config: ServerConfig, deps: AppDeps): AppParts {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.secureCookies ? 1 : false);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          connectSrc: ["'self'", 'ws:', 'wss:'],
          fontSrc: ["'self'", 'data:'],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          upgradeInsecureRequests: config.secureCookies ? [] : null,
        },
      },
      // HSTS only where the app is served over TLS (secure cookies): over plain HTTP it would lock browsers out.
      strictTransportSecurity: config.secureCookies ? { maxAge: 31_536_000, includeSubDomains: true } : false,
    }),
  );
  const session = createSessionMiddleware(sequelize, config);
  const passport = configurePassport();
  const sessionMiddleware = [session.middleware, session.absoluteTimeout, passport.initialize(), passport.session()];

  // An account change ends the user's other sessions and closes their live connections at once.
  const endSessionsOf = async (userId: number, exceptSid?: string) => {
    for (const sid of await endUserSessions(sequelize, userId, exceptSid)) deps.onSignOut?.(sid);
  };
  const api = express.Router();
  api.use('/api', express.json({ limit: '2mb' }), ...sessionMiddleware, csrf.csrfSynchronisedProtection);
  const routes: RouteSpec[] = [
    ...healthRoutes(sequelize),
    ...authRoutes({ passport, loginLimiter: loginLimiter(config), onSignOut: deps.onSignOut, endSessionsOf }),
    ...userRoutes({ endSessionsOf }),
    ...projectRoutes,
    ...sitePlanRoutes(config.dataDir),
    ...photoRoutes(config.dataDir),
    ...planRoutes,
    ...instrumentRoutes(config.dataDir),
    ...deviceProfileRoutes,
    ...rigRoutes,
    ...runRoutes(deps.runs),
    ...correctionRoutes,
    ...interpretationRoutes,
    ...importRoutes,
    ...ags4Routes,
    ...signoffRoutes(config, deps.events ?? deps.runs.events),
    ...reportRoutes(config.dataDir),
    ...mailboxRoutes(config.dataDir),
  ];
  mount(api, routes);
  api.use('/api', (_req, _res, next) => next(new HttpError(404, 'not_found', 'No such API route.')));
  api.use(errorHandler);
  app.use(api);

  if (config.clientDir && existsSync(path.join(config.clientDir, 'index.html'))) {
    const clientDir = config.clientDir;
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    // Client-side routes all load the single page.
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(clientDir, 'index.html')));
  }
  return { app, routes, sessionMiddleware, close: () => session.store.stopExpiringSessions() };
}
