import { useEffect } from 'react';
import { type AppSocket, getSocket } from '../../lib/socket';
import type { LiveStore } from './live-store';

/**
 * Keeps a live store fed from the server: joins the run's room on every (re)connection asking for
 * samples after the last sequence number received, so a dropped link backfills without a gap.
 */
export function useLiveRun(runId: number, store: LiveStore, socketFor: () => AppSocket = getSocket): void {
  useEffect(() => {
    const socket = socketFor();
    const join = () => {
      socket.emit('run:join', { runId, afterSeq: store.lastSeq }, (ack) => {
        if (ack.ok) store.setLink('live');
        else store.setLink('offline', ack.error);
      });
    };
    const onView: Parameters<typeof socket.on<'run:view'>>[1] = (view) => {
      if (view.id === runId) store.setView(view);
    };
    const onSamples: Parameters<typeof socket.on<'run:samples'>>[1] = (batch) => {
      if (batch.runId === runId) store.ingest(batch);
    };
    const onDisconnect = () => store.setLink('reconnecting');
    const onError = (error: Error) => store.setLink('reconnecting', error.message);

    socket.on('connect', join);
    socket.on('disconnect', onDisconnect);
    socket.on('connect_error', onError);
    socket.on('run:view', onView);
    socket.on('run:samples', onSamples);
    if (socket.connected) join();
    else store.setLink('connecting');

    return () => {
      socket.off('connect', join);
      socket.off('disconnect', onDisconnect);
      socket.off('connect_error', onError);
      socket.off('run:view', onView);
      socket.off('run:samples', onSamples);
      if (socket.connected) socket.emit('run:leave', { runId, afterSeq: 0 }, () => {});
    };
  }, [runId, store, socketFor]);
}
