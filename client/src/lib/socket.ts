import type { ClientToServerEvents, ServerToClientEvents } from '@shared/realtime/events';
import { io, type Socket } from 'socket.io-client';

export type AppSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

let shared: AppSocket | null = null;

/**
 * The one socket.io connection to the server (same origin; the session cookie signs it in). It is
 * opened on first use and reconnects by itself; features add and remove their own listeners.
 */
export function getSocket(): AppSocket {
  shared ??= io({ path: '/socket.io', withCredentials: true, transports: ['websocket', 'polling'] });
  return shared;
}

/** Closes the shared connection, e.g. at sign-out; the next getSocket() opens a fresh one. */
export function closeSocket(): void {
  shared?.disconnect();
  shared = null;
}
