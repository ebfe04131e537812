import type { SampleBatch } from '@shared/realtime/events';
import { createSampleSequencer, type SampleSequencerOptions } from '@shared/realtime/sample-sequencer';
import type { SampleSummary } from '@shared/runs/samples';
import type { RunView } from '@shared/schemas/runs';
import type { AppSocket } from './socket';

export type RunLink = 'connecting' | 'live' | 'reconnecting' | 'offline';

/** What a run's stream hands on; samples come in seq order, each exactly once. */
export interface RunStreamHandlers {
  samples(batch: SampleBatch): void;
  view?(view: RunView): void;
  /** A first join's per-minute min/max of everything before the current stage. */
  summary?(summary: SampleSummary): void;
  link?(link: RunLink, error?: string): void;
}

/** Options of {@link subscribeRunStream}. */
export interface RunStreamOptions extends SampleSequencerOptions {
  /** How often holes are looked for, ms. Default 250. */
  checkMs?: number;
  /** Clock for the hole timing; injectable for tests. Default Date.now. */
  now?: () => number;
}

/**
 * Follows one run over a socket.io connection: joins its room on every (re)connection, continuing
 * after the last sample handed on (a first join lets the server start at the current stage), puts
 * live and backfill batches in order through the sample sequencer, and asks again for any range
 * that stays missing. Used by the console; any other consumer of a run's stream can use it too.
 */
export function subscribeRunStream(socket: AppSocket, runId: number, handlers: RunStreamHandlers, { checkMs = 250, now = Date.now, ...options }: RunStreamOptions = {}) {
  const sequencer = createSampleSequencer(runId, options);
  /** Counts joins, so the answer to one overtaken by a reconnection is not taken for the newer one's. */
  let joins = 0;

  const join = () => {
    const id = ++joins;
    const afterSeq = sequencer.beginBackfill();
    socket.emit('run:join', afterSeq === undefined ? { runId } : { runId, afterSeq }, (ack) => {
      if (id !== joins) return;
      sequencer.endBackfill(now());
      if (ack.ok) handlers.link?.('live');
      else handlers.link?.('offline', ack.error);
      askForHoles();
    });
  };
  const askForHoles = () => {
    if (!socket.connected) return;
    const gap = sequencer.gap(now());
    if (gap) socket.emit('run:resend', { runId, ...gap }, () => {});
  };
  const onSamples = (batch: SampleBatch) => {
    if (batch.runId !== runId) return;
    const ordered = sequencer.accept(batch, now());
    if (ordered) handlers.samples(ordered);
  };
  const onView = (view: RunView) => {
    if (view.id === runId) handlers.view?.(view);
  };
  const onSummary = (summary: SampleSummary) => {
    if (summary.runId === runId) handlers.summary?.(summary);
  };
  const onDisconnect = () => handlers.link?.('reconnecting');
  const onError = (error: Error) => handlers.link?.('reconnecting', error.message);

  /** Adds or removes every listener of this stream. */
  const listen = (method: 'on' | 'off') => {
    socket[method]('connect', join);
    socket[method]('disconnect', onDisconnect);
    socket[method]('connect_error', onError);
    socket[method]('run:view', onView);
    socket[method]('run:summary', onSummary);
    socket[method]('run:samples', onSamples);
  };
  listen('on');
  const timer = setInterval(askForHoles, checkMs);
  if (socket.connected) join();
  else handlers.link?.('connecting');

  return {
    /** Every seq at or below this was handed on (or never existed); null before the first join is answered. */
    get head(): number | null {
      return sequencer.head;
    },
    close(): void {
      joins++; // an answer still on its way is no longer ours
      clearInterval(timer);
      listen('off');
      if (socket.connected) socket.emit('run:leave', { runId }, () => {});
    },
  };
}
