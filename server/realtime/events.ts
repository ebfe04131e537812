import { rigWatchInput } from '../../shared/realtime/events';
import type { RigMonitor } from '../acquisition/rig-monitor';
import { STAFF } from '../auth/permissions';
import { socketEvent } from './socket-server';

/** Every client→server socket event with its access rule; the permission matrix walks this table. */
export const socketEvents = (monitor: RigMonitor) => [
  socketEvent({
    event: 'rig:watch',
    access: STAFF,
    input: rigWatchInput,
    handler: async (socket, { rigId }) => {
      await monitor.open(rigId);
      await socket.join(monitor.room(rigId));
      const live = monitor.snapshot(rigId);
      if (live) socket.emit('rig:live', live);
    },
  }),
  socketEvent({
    event: 'rig:unwatch',
    access: STAFF,
    input: rigWatchInput,
    handler: async (socket, { rigId }) => {
      await socket.leave(monitor.room(rigId));
    },
  }),
];
