import type { AppSocket } from '../../../client/src/lib/socket';

type Handler = (...args: never[]) => void;

/**
 * A stand-in for the socket.io client: records what the page emits (answering acks with ok) and
 * lets a test deliver server events and connection changes.
 */
export function fakeSocket() {
  const handlers = new Map<string, Set<Handler>>();
  const emitted: { event: string; payload: unknown }[] = [];
  const socket = {
    connected: false,
    on(event: string, handler: Handler) {
      if (!handlers.has(event)) handlers.set(event, new Set());
      handlers.get(event)?.add(handler);
      return socket;
    },
    off(event: string, handler: Handler) {
      handlers.get(event)?.delete(handler);
      return socket;
    },
    emit(event: string, payload: unknown, ack?: (result: { ok: true }) => void) {
      emitted.push({ event, payload });
      ack?.({ ok: true });
      return socket;
    },
  };
  const deliver = (event: string, ...args: unknown[]) => {
    for (const h of handlers.get(event) ?? []) (h as (...a: unknown[]) => void)(...args);
  };
  return {
    socket: socket as unknown as AppSocket,
    emitted,
    deliver,
    connect() {
      socket.connected = true;
      deliver('connect');
    },
    drop() {
      socket.connected = false;
      deliver('disconnect', 'transport close');
    },
    listeners: (event: string) => handlers.get(event)?.size ?? 0,
  };
}
