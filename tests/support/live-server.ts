import { io, type Socket } from 'socket.io-client';
import type { ServerConfig } from '../../server/config';
import { type RunningServer, startServer } from '../../server/main';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import type { ClientToServerEvents, ServerToClientEvents } from '../../shared/realtime/events';
import { seededDatabase } from './test-database';

/** A real listening server over a fresh, demo-seeded database (a copy of the run's template). */
export async function startLiveServer(overrides: Partial<ServerConfig> = {}): Promise<RunningServer> {
  return startServer(await seededDatabase(overrides));
}

/** Signs in over HTTP; returns the session cookie and CSRF token. */
export async function httpSignIn(baseUrl: string, email: string, password = DEMO_PASSWORD) {
  const pre = await fetch(`${baseUrl}/api/auth/csrf`);
  const cookie0 = pre.headers.getSetCookie()[0]?.split(';')[0] ?? '';
  const { csrfToken } = await pre.json();
  const res = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': csrfToken, cookie: cookie0 },
    body: JSON.stringify({ email, password }),
  });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status}`);
  const cookie = res.headers.getSetCookie()[0].split(';')[0];
  return { cookie, csrfToken: (await res.json()).csrfToken as string };
}

export type TestSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

/** A socket.io client carrying the session cookie; resolves once connected or rejects with the refusal. */
export function connectSocket(baseUrl: string, cookie?: string): Promise<TestSocket> {
  const socket: TestSocket = io(baseUrl, { transports: ['websocket'], extraHeaders: cookie ? { cookie } : {}, reconnection: false, forceNew: true });
  return new Promise((resolve, reject) => {
    socket.once('connect', () => resolve(socket));
    socket.once('connect_error', (err) => {
      socket.close();
      reject(err);
    });
  });
}
