/** Typed socket.io events between the server and browsers (the gateway link uses `ws`, not these). */
import { z } from 'zod';
import type { SampleStatus } from '../devices/schema';
import type { RunView } from '../schemas/runs';

export const rigWatchInput = z.object({ rigId: z.number().int().positive() });
export const runJoinInput = z.object({ runId: z.number().int().positive(), afterSeq: z.number().int().min(0).default(0) });

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
}

export interface RigLive {
  rigId: number;
  channels: ChannelLive[];
  /** Set when the rig cannot be read here (e.g. a run is using its ports). */
  problem: string | null;
}

export type Ack = { ok: true } | { ok: false; error: string };

/** Samples in columns (seq, run time ms, channel index, value in micro-units or null). */
export interface SampleBatch {
  runId: number;
  seq: number[];
  t: number[];
  channel: number[];
  value: (number | null)[];
}

export interface ServerToClientEvents {
  'rig:live': (live: RigLive) => void;
  'run:view': (view: RunView) => void;
  'run:samples': (batch: SampleBatch) => void;
}

export interface ClientToServerEvents {
  'rig:watch': (input: z.input<typeof rigWatchInput>, ack: (result: Ack) => void) => void;
  'rig:unwatch': (input: z.input<typeof rigWatchInput>, ack: (result: Ack) => void) => void;
  'run:join': (input: z.input<typeof runJoinInput>, ack: (result: Ack) => void) => void;
  'run:leave': (input: z.input<typeof runJoinInput>, ack: (result: Ack) => void) => void;
}
