import type { DeviceProblem } from '@shared/devices/problems';
import type { DeviceSample, SampleStatus } from '@shared/devices/schema';
import type { Clock } from '../port/clock';
import type { LinkStatus } from '../port/serial-link';

/** Health of one device: link status and frame counters since the reader was made. */
export interface DeviceStats {
  status: LinkStatus;
  framesOk: number;
  rejected: number;
  timeouts: number;
  reconnects: number;
  /** Bytes discarded as noise or overlong garbage, not part of any frame. */
  droppedBytes: number;
  lastError?: string;
  lastRejectReason?: string;
  /** Cause of the latest sample without a value (rejection, timeout, lost port). */
  lastProblem?: DeviceProblem;
  /** False until the port has opened once: a port that never opened is not a device that went quiet. */
  everOpened: boolean;
}

/** Options of {@link SampleChannel}. */
export interface SampleChannelOptions {
  deviceId: string;
  channel: string;
  onSample: (sample: DeviceSample) => void;
  clock: Clock;
  /** Sequence number of the first sample, so a restarted reader continues a device's numbering. Defaults to 1. */
  nextSeq?: number;
}

/**
 * Stamps and counts the samples of one device: a sequence number rising by one per sample and a
 * monotonic time. Every outcome becomes a sample so the record shows it; only 'ok' carries a value.
 */
export class SampleChannel {
  framesOk = 0;
  rejected = 0;
  timeouts = 0;
  lastRejectReason?: string;
  lastProblem?: DeviceProblem;
  private seq: number;

  constructor(private readonly options: SampleChannelOptions) {
    this.seq = options.nextSeq ?? 1;
    if (!Number.isSafeInteger(this.seq) || this.seq < 0) throw new RangeError('"nextSeq" must be a non-negative integer');
  }

  ok(raw: string, value: number): void {
    this.framesOk++;
    this.emit('ok', raw, value);
  }

  /** A frame that arrived but cannot be trusted: kept raw, never given a value. Without a problem, its shape was wrong. */
  reject(raw: string, reason: string, problem: DeviceProblem = { kind: 'framing', detail: reason }): void {
    this.rejected++;
    this.lastRejectReason = reason;
    this.emit('rejected', raw, undefined, problem);
  }

  /** No reply (polled) or no line (streaming) within the profile's timeout. */
  timeout(raw = ''): void {
    this.timeouts++;
    this.emit('timeout', raw, undefined, { kind: 'timeout' });
  }

  /** The port vanished: marks the start of a gap in the record. */
  disconnected(reason = 'port closed'): void {
    this.emit('disconnected', '', undefined, { kind: 'port-lost', detail: reason });
  }

  private emit(status: SampleStatus, raw: string, value?: number, problem?: DeviceProblem): void {
    const { deviceId, channel, clock, onSample } = this.options;
    const sample: DeviceSample = { deviceId, channel, seq: this.seq++, t: clock.now(), raw, status };
    if (value !== undefined) sample.value = value;
    if (problem) {
      sample.problem = problem;
      this.lastProblem = problem;
    }
    onSample(sample);
  }
}
