import type { DeviceSample, SerialSettings } from '@shared/devices/schema';
import type { BackoffOptions } from '../port/backoff';
import { type Clock, systemClock } from '../port/clock';
import { type LinkStatus, type PortOpenOptions, SerialLink, type SerialStream } from '../port/serial-link';
import type { ReplyOutcome, ReplyWaiter } from './polling';
import { type DeviceStats, SampleChannel } from './sample-channel';

/** Options every device reader takes. */
export interface DeviceReaderOptions {
  /** Instrument id written into each sample. */
  deviceId: string;
  /** Channel name written into each sample, e.g. "gauge-1" or "pressure". */
  channel: string;
  /** Serial device path, e.g. "/dev/ttyUSB0". */
  path: string;
  /** Receives every sample, in sequence order. */
  onSample: (sample: DeviceSample) => void;
  /** Sequence number of the first sample. Defaults to 1. */
  nextSeq?: number;
  /** Port factory. Defaults to serialport's `SerialPort`. */
  createPort?: (options: PortOpenOptions) => SerialStream;
  /** Reconnection delays. Defaults: 250 ms, ×1.5, at most 5000 ms. */
  backoff?: BackoffOptions;
  /** Time source for sample times, timeouts and retries. Defaults to the system's monotonic clock. */
  clock?: Clock;
}

/**
 * What a reader does around its protocol: owns the link and the sample channel, marks a lost
 * port with a 'disconnected' sample and reports its health. Subclasses handle the bytes.
 */
export abstract class DeviceReader {
  protected readonly clock: Clock;
  protected readonly link: SerialLink;
  protected readonly samples: SampleChannel;
  private up = false;

  constructor(options: DeviceReaderOptions, serial: SerialSettings) {
    this.clock = options.clock ?? systemClock;
    this.samples = new SampleChannel({ ...options, clock: this.clock });
    this.link = new SerialLink({
      path: options.path,
      serial,
      clock: this.clock,
      backoff: options.backoff,
      createPort: options.createPort,
      onData: (chunk) => this.onData(chunk),
      onStatus: (status, reason) => this.onStatus(status, reason),
    });
  }

  start(): void {
    this.link.start();
  }

  async stop(): Promise<void> {
    this.up = false;
    this.onLinkDown();
    await this.link.stop();
  }

  stats(): DeviceStats {
    const { framesOk, rejected, timeouts, lastRejectReason, lastProblem } = this.samples;
    const { status, reconnects, lastError, everOpened } = this.link;
    return { status, framesOk, rejected, timeouts, reconnects, droppedBytes: this.droppedBytes, lastError, lastRejectReason, lastProblem, everOpened };
  }

  /** Writes a request and waits for what settles `waiter` first: reply, timeout or cancellation. */
  protected async ask<T>(waiter: ReplyWaiter<T>, request: Uint8Array | string, timeoutMs: number): Promise<ReplyOutcome<T>> {
    const answer = waiter.wait(timeoutMs);
    try {
      await this.link.write(request);
    } catch {
      waiter.cancel(); // the link reports the loss itself
    }
    return answer;
  }

  /** Bytes discarded as noise, not part of any frame. */
  protected abstract get droppedBytes(): number;
  protected abstract onData(chunk: Buffer): void;
  /** The port has (re)opened. */
  protected abstract onLinkUp(): void;
  /** The port is lost or being closed: cancel pending work. */
  protected abstract onLinkDown(): void;

  private onStatus(status: LinkStatus, reason?: string): void {
    if (status === 'open') {
      this.up = true;
      this.onLinkUp();
    } else if (status === 'error' && this.up) {
      this.up = false;
      this.onLinkDown();
      this.samples.disconnected(reason);
    }
  }
}
