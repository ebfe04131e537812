/**
 * socket.io for browsers, sharing the Express session: a socket belongs to a signed-in user or is
 * refused; each socket joins its session's room so sign-out can disconnect it (QUALITY S4). Event
 * handlers are declared with an access rule, like REST routes, so the permission matrix covers them.
 */
import type http from 'node:http';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { Server, type Socket } from 'socket.io';
import type { ZodType } from 'zod';
import type { Ack, ClientToServerEvents, ServerToClientEvents } from '../../shared/realtime/events';
import { type Access, allows } from '../auth/permissions';
import type { User } from '../models/user';

export type AppSocket = Socket<ClientToServerEvents, ServerToClientEvents> & { data: { user: User; sessionId: string } };

/** One client→server event: who may send it, its input schema, and its handler. */
export interface SocketEventSpec<I = unknown> {
  event: keyof ClientToServerEvents;
  access: Access;
  input: ZodType<I>;
  handler: (socket: AppSocket, input: I) => Promise<void> | void;
}

export const socketEvent = <I>(spec: SocketEventSpec<I>) => spec as unknown as SocketEventSpec;

type IncomingWithSession = http.IncomingMessage & { user?: User; sessionID?: string; res?: Response };

/** Runs Express middleware on the handshake request only (socket.io's recommended pattern). */
function onlyForHandshake(middleware: RequestHandler) {
  return (req: IncomingWithSession & { _query?: Record<string, string> }, res: Response, next: NextFunction) => {
    if (req._query?.sid === undefined) middleware(req as unknown as Request, res, next);
    else next();
  };
}

/**
 * Refuses a handshake sent by a page of another site (cross-site WebSocket hijacking): a browser names
 * the page's origin, which must be this host. Clients that send no Origin (not a browser page) pass.
 */
export function sameOrigin(req: http.IncomingMessage): boolean {
  const origin = req.headers.origin;
  if (origin === undefined) return true;
  const forwarded = req.headers['x-forwarded-host'];
  const hosts = [req.headers.host, ...(typeof forwarded === 'string' ? forwarded.split(',').map((h) => h.trim()) : [])];
  try {
    return hosts.includes(new URL(origin).host);
  } catch {
    return false;
  }
}

export function createSocketServer(httpServer: http.Server, sessionMiddleware: RequestHandler[]) {
  const io = new Server<ClientToServerEvents, ServerToClientEvents>(httpServer, {
    serveClient: false,
    maxHttpBufferSize: 64 * 1024,
    allowRequest: (req, callback) => {
      const ok = sameOrigin(req);
      callback(ok ? null : 'origin_not_allowed', ok);
    },
  });
  for (const mw of sessionMiddleware) io.engine.use(onlyForHandshake(mw));
  io.use((socket, next) => {
    const req = socket.request as IncomingWithSession;
    if (!req.user) return next(new Error('authentication_required'));
    socket.data = { user: req.user, sessionId: req.sessionID ?? '' };
    next();
  });
  const handle = (events: SocketEventSpec[]) =>
    io.on('connection', (raw) => {
      const socket = raw as AppSocket;
      socket.join(`session:${socket.data.sessionId}`);
      for (const spec of events) {
        socket.on(spec.event, async (input: unknown, ack?: (r: Ack) => void) => {
          const reply = typeof ack === 'function' ? ack : () => {};
          if (!allows(spec.access, socket.data.user.role)) return reply({ ok: false, error: 'forbidden: your role may not do this' });
          const parsed = spec.input.safeParse(input ?? {});
          if (!parsed.success) {
            const issue = parsed.error.issues[0];
            return reply({ ok: false, error: `invalid_input: ${issue.path.join('.') || 'input'}: ${issue.message}` });
          }
          try {
            await spec.handler(socket, parsed.data);
            reply({ ok: true });
          } catch (err) {
            reply({ ok: false, error: (err as Error).message });
          }
        });
      }
    });
  return {
    io,
    /** Registers the client→server events every new connection will answer. */
    handle,
    /** Ends every live connection of a session (called at sign-out). */
    disconnectSession: (sessionId: string) => io.in(`session:${sessionId}`).disconnectSockets(true),
    close: () => new Promise<void>((resolve) => io.close(() => resolve())),
  };
}
