/** Typed socket.io events between the server and browsers (the gateway link uses `ws`, not these). */
import { z } from 'zod';
import type { SampleStatus } from '../devices/schema';
import type { SampleSummary } from '../runs/samples';
import type { RunView } from '../schemas/runs';

/** Most seqs one resend may ask for (a consumer asks for more in steps). */
export const RESEND_MAX = 100_000;

export const rigWatchInput = z.object({ rigId: z.number().int().positive() });
/** `afterSeq` continues after that sample; without it (a first join) the stream starts at the current stage, the rest summarised. */
export const runJoinInput = z.object({ runId: z.number().int().positive(), afterSeq: z.number().int().min(0).optional() });
/** Asks again for a range of a run's stream that a consumer found missing (at most `RESEND_MAX` seqs). */
export const runResendInput = z
  .object({ runId: z.number().int().positive(), after: z.number().int().min(0), through: z.number().int().min(1) })
  .refine((r) => r.through > r.after && r.through - r.after <= RESEND_MAX, { message: `through must lie above after, by at most ${RESEND_MAX}`, path: ['through'] });

/** One channel as the device check page shows it. */
export interface ChannelLive {
  key: string;
  label: string;
  role: 'gauge' | 'pressure' | 'load';
  unit: string;
  raw: number | null;
  value: number | null;
  status: SampleStatus;
  /** Wall-clock time of the latest sample, ms since the epoch; null before the first. */
  atMs: number | null;
  port: string;
  link: 'connecting' | 'open' | 'error' | 'closed' | 'manual';
  framesOk: number;
  rejected: number;
  timeouts: number;
  reconnects: number;
  calibration: 'in-calibration' | 'due-soon' | 'overdue' | 'uncalibrated' | 'no-instrument';
  /** Why the channel gives no good reading now, in words (describeDeviceProblem); null while it reads well. */
  problem: string | null;
  /** The cause of the latest rejected frame, in words, even when readings are good again; null if none. */
  lastRejection: string | null;
}

export interface RigLive {
  rigId: number;
  channels: ChannelLive[];
  /** Set when the rig cannot be read here (e.g. a run is using its ports). */
  problem: string | null;
}

export type Ack = { ok: true } | { ok: false; error: string };

/** A range of seqs, `after` < seq ≤ `through`. */
export interface SeqSpan {
  after: number;
  through: number;
}

/** Samples in columns (seq, run time ms, channel index, value in micro-units or null), in seq order. */
export interface SampleBatch {
  runId: number;
  seq: number[];
  t: number[];
  channel: number[];
  value: (number | null)[];
  /**
   * Set on backfill and resend answers: the batch holds every sample of the run in this range, so a
   * seq missing inside it never existed. Live batches leave it out.
   */
  span?: SeqSpan;
}

export interface ServerToClientEvents {
  'rig:live': (live: RigLive) => void;
  'run:view': (view: RunView) => void;
  'run:samples': (batch: SampleBatch) => void;
  /** On a first join, before its samples: per-minute min/max of everything before the current stage. */
  'run:summary': (summary: SampleSummary) => void;
}

export interface ClientToServerEvents {
  'rig:watch': (input: z.input<typeof rigWatchInput>, ack: (result: Ack) => void) => void;
  'rig:unwatch': (input: z.input<typeof rigWatchInput>, ack: (result: Ack) => void) => void;
  'run:join': (input: z.input<typeof runJoinInput>, ack: (result: Ack) => void) => void;
  'run:leave': (input: z.input<typeof runJoinInput>, ack: (result: Ack) => void) => void;
  'run:resend': (input: z.input<typeof runResendInput>, ack: (result: Ack) => void) => void;
}
