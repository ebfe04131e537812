import type { RigLive } from '@shared/realtime/events';
import { useEffect, useState } from 'react';
import { type AppSocket, getSocket } from '../../../lib/socket';

/** The socket calls the live feed needs; the shared app socket, or a stand-in in tests. */
export type RigLiveSocket = Pick<AppSocket, 'on' | 'off' | 'emit' | 'connected'>;

export interface RigLiveFeed {
  /** The latest picture of the rig, or null before the first one arrives. */
  live: RigLive | null;
  /** Whether the browser is connected to the server right now. */
  connected: boolean;
  /** Why the server refused to watch this rig, if it did. */
  refused: string | null;
}

/**
 * Watches one rig over the socket: 'rig:live' about every 250 ms while the page is open. The watch
 * is asked for again after every reconnect, since the server forgets watchers of a lost connection.
 */
export function useRigLive(rigId: number, socket: RigLiveSocket = getSocket()): RigLiveFeed {
  const [feed, setFeed] = useState<RigLiveFeed>({ live: null, connected: socket.connected, refused: null });

  useEffect(() => {
    const watch = () => {
      setFeed((f) => ({ ...f, connected: true }));
      socket.emit('rig:watch', { rigId }, (ack) => setFeed((f) => ({ ...f, refused: ack.ok ? null : ack.error })));
    };
    const onLive = (live: RigLive) => {
      if (live.rigId === rigId) setFeed((f) => ({ ...f, live, connected: true }));
    };
    const onDisconnect = () => setFeed((f) => ({ ...f, connected: false }));
    socket.on('connect', watch);
    socket.on('disconnect', onDisconnect);
    socket.on('rig:live', onLive);
    if (socket.connected) watch();
    return () => {
      socket.off('connect', watch);
      socket.off('disconnect', onDisconnect);
      socket.off('rig:live', onLive);
      socket.emit('rig:unwatch', { rigId }, () => {});
    };
  }, [rigId, socket]);

  return feed;
}
