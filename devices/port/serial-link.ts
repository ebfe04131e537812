import createDebug from 'debug';
import { SerialPort } from 'serialport';
import type { SerialSettings } from '@shared/devices/schema';
import { type BackoffOptions, nextBackoffMs } from './backoff';
import { type Clock, systemClock } from './clock';

const debug = createDebug('settlescope:devices:port');

/** 'connecting' while an open is under way, 'error' while lost and waiting to retry, 'closed' once stopped. */
export type LinkStatus = 'connecting' | 'open' | 'error' | 'closed';

/** Options handed to the port factory: the serial settings, never auto-opened. */
export type PortOpenOptions = SerialSettings & { path: string; autoOpen: false };

/** What the link uses of a serialport stream; `SerialPort` and `SerialPortMock` both provide it. */
export type SerialStream = Pick<SerialPort, 'isOpen' | 'open' | 'close' | 'write' | 'on' | 'removeAllListeners'>;

/** Options of {@link SerialLink}. */
export interface SerialLinkOptions {
  /** Device path, e.g. "/dev/ttyUSB0". */
  path: string;
  /** Baud rate, data bits, parity, stop bits. */
  serial: SerialSettings;
  /** Receives every chunk read from the port. */
  onData: (chunk: Buffer) => void;
  /** Told of every status change, with the reason for 'error'. */
  onStatus?: (status: LinkStatus, reason?: string) => void;
  /** Builds the port stream. Defaults to serialport's `SerialPort`; tests pass `SerialPortMock`. */
  createPort?: (options: PortOpenOptions) => SerialStream;
  /** Reconnection delays. Defaults: 250 ms, ×1.5, at most 5000 ms. */
  backoff?: BackoffOptions;
  /** Timer source for retries. Defaults to the system clock. */
  clock?: Clock;
}

/**
 * One serial port kept open: opens it, notices when it vanishes (a close carrying
 * `disconnected: true`, or any close we did not ask for), and reopens it with growing delays
 * until it is back or the link is stopped. Knows nothing of protocols.
 */
export class SerialLink {
  status: LinkStatus = 'closed';
  /** Successful reopenings after a loss. */
  reconnects = 0;
  lastError?: string;
  private port?: SerialStream;
  private cancelRetry?: () => void;
  private retryDelayMs?: number;
  /** False until the port has opened once. */
  everOpened = false;
  private readonly clock: Clock;
  private readonly createPort: (options: PortOpenOptions) => SerialStream;

  constructor(private readonly options: SerialLinkOptions) {
    this.clock = options.clock ?? systemClock;
    this.createPort = options.createPort ?? ((o) => new SerialPort(o));
    nextBackoffMs(undefined, options.backoff); // check the options now, not at the first loss
  }

  /** Starts opening the port; failures are retried, never thrown. */
  start(): void {
    if (this.status === 'closed') this.connect();
  }

  /** Writes bytes; rejects when the port is not open or the write fails. */
  write(data: Uint8Array | string): Promise<void> {
    const port = this.port;
    if (this.status !== 'open' || !port) return Promise.reject(new Error(`port ${this.options.path} is not open`));
    return new Promise((resolve, reject) => {
      port.write(typeof data === 'string' ? Buffer.from(data, 'latin1') : data, (error) => (error ? reject(error) : resolve()));
    });
  }

  /** Closes the port and stops retrying. */
  async stop(): Promise<void> {
    this.cancelRetry?.();
    this.cancelRetry = undefined;
    const port = this.port;
    this.port = undefined;
    if (port) {
      this.abandon(port);
      if (port.isOpen) await new Promise<void>((resolve) => port.close(() => resolve()));
    }
    this.setStatus('closed');
  }

  private connect(): void {
    this.setStatus('connecting');
    const { path, serial } = this.options;
    const port = this.createPort({ path, ...serial, autoOpen: false });
    this.port = port;
    port.on('data', (chunk: Buffer) => this.options.onData(chunk));
    port.on('close', (error?: Error | null) => this.lost(port, error?.message ?? 'port closed'));
    port.on('error', (error: Error) => {
      this.lastError = error.message;
      if (!port.isOpen) this.lost(port, error.message);
    });
    port.open((error) => {
      if (this.port !== port) {
        if (!error) port.close(); // stopped while opening
        return;
      }
      if (error) return this.lost(port, error.message);
      if (this.everOpened) this.reconnects++;
      this.everOpened = true;
      this.retryDelayMs = undefined;
      this.setStatus('open');
    });
  }

  private lost(port: SerialStream, reason: string): void {
    if (this.port !== port) return; // an abandoned port, or the link was stopped
    this.port = undefined;
    this.abandon(port);
    if (port.isOpen) port.close();
    this.lastError = reason;
    this.setStatus('error', reason);
    this.retryDelayMs = nextBackoffMs(this.retryDelayMs, this.options.backoff);
    debug('%s lost (%s); retry in %d ms', this.options.path, reason, this.retryDelayMs);
    this.cancelRetry = this.clock.after(this.retryDelayMs, () => {
      this.cancelRetry = undefined;
      this.connect();
    });
  }

  /** Detaches our handlers; a no-op error handler stays so a late error cannot crash the process. */
  private abandon(port: SerialStream): void {
    port.removeAllListeners();
    port.on('error', () => {});
  }

  private setStatus(status: LinkStatus, reason?: string): void {
    if (status === this.status) return;
    this.status = status;
    debug('%s %s', this.options.path, status);
    this.options.onStatus?.(status, reason);
  }
}
