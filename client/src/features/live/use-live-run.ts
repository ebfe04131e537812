import { useEffect } from 'react';
import { subscribeRunStream } from '../../lib/run-stream';
import { type AppSocket, getSocket } from '../../lib/socket';
import type { LiveStore } from './live-store';

/**
 * Keeps a live store fed from the server through the run's stream: joined again on every
 * reconnection after the last sample handed on, live batches that overtake the backfill held back,
 * every sample delivered once and in order, missing ranges asked for again.
 */
export function useLiveRun(runId: number, store: LiveStore, socketFor: () => AppSocket = getSocket): void {
  useEffect(() => {
    const stream = subscribeRunStream(socketFor(), runId, {
      samples: (batch) => store.ingest(batch),
      view: (view) => store.setView(view),
      link: (link, error) => store.setLink(link, error ?? null),
    });
    return () => stream.close();
  }, [runId, store, socketFor]);
}
