import type { Server } from 'socket.io';
import { rigWatchInput, runJoinInput } from '../../shared/realtime/events';
import { notFound } from '../http/errors';
import type { RunManager } from '../runs/run-manager';
import { samplesAfter, toBatch } from '../runs/samples-query';
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
      await socket.join(runRoom(runId));
      socket.once('disconnect', () => void updateWatchers(io, runs, runId));
      await updateWatchers(io, runs, runId);
      socket.emit('run:view', engine.view());
      // Backfill everything after the client's last sequence number, archived first.
      let from = afterSeq;
      for (;;) {
        const rows = await samplesAfter(runs.archiver.sequelize, runId, from, 20_000);
        if (rows.length === 0) break;
        socket.emit('run:samples', toBatch(runId, rows));
        from = rows[rows.length - 1].seq;
      }
      const rest = runs.unarchived(runId, from);
      if (rest.length > 0) socket.emit('run:samples', toBatch(runId, rest));
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
