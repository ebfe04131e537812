import type { Server } from 'socket.io';
import { rigWatchInput, runJoinInput, runResendInput } from '../../shared/realtime/events';
import { notFound } from '../http/errors';
import type { RunManager } from '../runs/run-manager';
import { sendRange, stageStartSeq, summaryBefore } from './stream';
import type { RigMonitor } from '../acquisition/rig-monitor';
import { STAFF } from '../auth/permissions';
import { type AppSocket, socketEvent } from './socket-server';

export const runRoom = (runId: number) => `run:${runId}`;

/** Tells a run who is watching it (everyone in its room). */
async function updateWatchers(io: Server, runs: RunManager, runId: number) {
  const engine = runs.engine(runId);
  if (!engine) return;
  const sockets = (await io.in(runRoom(runId)).fetchSockets()) as unknown as AppSocket[];
  const people = new Map(sockets.map((s) => [s.data.user.id, { id: s.data.user.id, name: s.data.user.name, role: s.data.user.role }]));
  engine.setWatchers([...people.values()]);
}

/** Every client→server socket event with its access rule; the permission matrix walks this table. */
export const socketEvents = (monitor: RigMonitor, runs: RunManager, io: Server) => [
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
  socketEvent({
    event: 'run:join',
    access: STAFF,
    input: runJoinInput,
    handler: async (socket, { runId, afterSeq }) => {
      const engine = await runs.load(runId);
      if (!engine) throw notFound('Run');
      // In the room first, so every sample secured after the backfill's last read arrives live; the
      // overlap is the consumer's to drop (it orders by seq, see shared/realtime/sample-sequencer).
      await socket.join(runRoom(runId));
      socket.once('disconnect', () => void updateWatchers(io, runs, runId));
      await updateWatchers(io, runs, runId);
      const view = engine.view();
      socket.emit('run:view', view);
      let after = afterSeq;
      if (after === undefined) {
        // A first join: the current stage in full, everything before it as per-minute min/max.
        after = await stageStartSeq(runs, runId, view.stageStartedAtMs, view.lastSeq);
        const summary = await summaryBefore(runs, runId, view.stageStartedAtMs);
        if (summary) socket.emit('run:summary', summary);
      }
      await sendRange(socket, runs, runId, after, Number.POSITIVE_INFINITY);
    },
  }),
  socketEvent({
    event: 'run:resend',
    access: STAFF,
    input: runResendInput,
    handler: async (socket, { runId, after, through }) => {
      if (!socket.rooms.has(runRoom(runId))) throw notFound('Run');
      await sendRange(socket, runs, runId, after, through);
    },
  }),
  socketEvent({
    event: 'run:leave',
    access: STAFF,
    input: runJoinInput,
    handler: async (socket, { runId }) => {
      await socket.leave(runRoom(runId));
      await updateWatchers(io, runs, runId);
    },
  }),
];
