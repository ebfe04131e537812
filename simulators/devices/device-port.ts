import type { SerialSettings } from '@shared/devices/schema';
import createDebug from 'debug';
import { SerialPort } from 'serialport';
import type { Random } from '../physics/random';
import type { FaultBoard } from './faults';

const debug = createDebug('settlescope:simulators:device-port');

/** Options of {@link DevicePort}. */
export interface DevicePortOptions {
  /** The device end of a pseudo-terminal pair. */
  path: string;
  serial: SerialSettings;
  /** Faults that shape what is written. */
  faults: FaultBoard;
  /** Receives every chunk the application writes. */
  onData: (chunk: Buffer) => void;
  /** Source of garbage bytes. Defaults to Math.random. */
  random?: Random;
  /** Pause between the pieces of a split write, ms. Defaults to 5. */
  splitGapMs?: number;
}

/**
 * The device end of a serial line: opened and closed by the simulator (which knows when the pty
 * vanishes and comes back), and every write shaped by the active faults.
 */
export class DevicePort {
  #port?: SerialPort;
  #held?: Buffer;
  readonly #timers = new Set<NodeJS.Timeout>();
  readonly #random: Random;
  /** Writes sent and writes swallowed by a 'drop' fault. */
  readonly counts = { sent: 0, dropped: 0 };

  constructor(private readonly options: DevicePortOptions) {
    this.#random = options.random ?? Math.random;
  }

  get isOpen(): boolean {
    return this.#port?.isOpen ?? false;
  }

  async open(): Promise<void> {
    if (this.#port) return;
    const port = new SerialPort({ path: this.options.path, ...this.options.serial, autoOpen: false });
    port.on('data', (chunk: Buffer) => this.options.onData(chunk));
    port.on('close', () => this.#forget(port));
    port.on('error', (error: Error) => debug('%s: %s', this.options.path, error.message));
    await new Promise<void>((resolve, reject) => port.open((error) => (error ? reject(error) : resolve())));
    this.#port = port;
  }

  async close(): Promise<void> {
    const port = this.#port;
    this.#forget(port);
    if (port?.isOpen) await new Promise<void>((resolve) => port.close(() => resolve()));
  }

  /** Writes bytes as the active faults allow; silently does nothing while the port is closed. */
  send(data: Uint8Array | string): void {
    const { faults } = this.options;
    if (!this.isOpen) return;
    if (faults.has('drop')) {
      this.counts.dropped++;
      return;
    }
    let bytes = Buffer.from(typeof data === 'string' ? Buffer.from(data, 'latin1') : data);
    if (faults.has('garbage')) bytes = Buffer.concat([this.#garbage(), bytes]);
    if (this.#held) {
      bytes = Buffer.concat([this.#held, bytes]);
      this.#held = undefined;
    } else if (faults.has('merge')) {
      this.#held = bytes;
      return;
    }
    this.counts.sent++;
    if (faults.has('split') && bytes.length > 1) {
      const cut = 1 + Math.floor(this.#random() * (bytes.length - 1));
      this.#write(bytes.subarray(0, cut));
      this.#later(() => this.#write(bytes.subarray(cut)));
    } else {
      this.#write(bytes);
    }
  }

  #write(bytes: Buffer): void {
    if (this.#port?.isOpen) this.#port.write(bytes);
  }

  #later(fn: () => void): void {
    const timer = setTimeout(() => {
      this.#timers.delete(timer);
      fn();
    }, this.options.splitGapMs ?? 5);
    this.#timers.add(timer);
  }

  #garbage(): Buffer {
    const length = 3 + Math.floor(this.#random() * 6);
    return Buffer.from(Array.from({ length }, () => Math.floor(this.#random() * 256)));
  }

  /** Drops a port that closed or vanished; a late error must not crash the process. */
  #forget(port: SerialPort | undefined): void {
    if (!port || this.#port !== port) return;
    this.#port = undefined;
    this.#held = undefined;
    for (const timer of this.#timers) clearTimeout(timer);
    this.#timers.clear();
    port.removeAllListeners();
    port.on('error', () => {});
  }
}
