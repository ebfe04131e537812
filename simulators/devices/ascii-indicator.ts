import type { AsciiProfile } from '@shared/devices/schema';
import createDebug from 'debug';
import { encodeIndicatorLine } from '../../devices/ascii/encode';
import type { DevicePort } from './device-port';

const debug = createDebug('settlescope:simulators:ascii-indicator');

/** Options of {@link SimulatedIndicator}. */
export interface SimulatedIndicatorOptions {
  /** The protocol spoken, as the application's reader knows it. */
  profile: AsciiProfile;
  /** The gauge reading to print now, mm. */
  read: () => number;
  /** Lines per period of a streaming indicator, ms of wall time. Defaults to the profile's `pollIntervalMs`. */
  streamIntervalMs?: number;
}

/**
 * Splits received text into complete requests and the tail that may still become one. The tail
 * is kept no longer than the request minus one character, so noise cannot pile up.
 */
export function takeRequests(pending: string, request: string): { count: number; rest: string } {
  const parts = pending.split(request);
  const tail = parts[parts.length - 1];
  return { count: parts.length - 1, rest: tail.slice(Math.max(0, tail.length - (request.length - 1))) };
}

/**
 * A digital displacement indicator on the device end of a pty: polled, it answers each request
 * with one line; streaming, it prints a line every period. Lines are the profile's own format.
 */
export class SimulatedIndicator {
  #pending = '';
  #timer?: NodeJS.Timeout;
  #port?: DevicePort;
  readonly #profile: AsciiProfile;

  constructor(private readonly options: SimulatedIndicatorOptions) {
    this.#profile = options.profile;
    if (this.#profile.mode === 'polled' && !this.#profile.request) throw new TypeError(`"request" of polled profile "${this.#profile.id}" is empty`);
    encodeIndicatorLine(this.#profile, 0); // a pattern the encoder cannot print fails now, naming "pattern"
  }

  /** Receives what the application wrote (wire this to the port's `onData`). */
  receive(chunk: Buffer): void {
    if (this.#profile.mode !== 'polled') return;
    const { count, rest } = takeRequests(this.#pending + chunk.toString('latin1'), this.#profile.request);
    this.#pending = rest;
    for (let i = 0; i < count; i++) this.#sendReading();
  }

  /** Starts answering (or streaming) on an open port. */
  attach(port: DevicePort): void {
    this.detach();
    this.#port = port;
    if (this.#profile.mode === 'streaming') {
      this.#timer = setInterval(() => this.#sendReading(), this.options.streamIntervalMs ?? this.#profile.pollIntervalMs);
    }
  }

  detach(): void {
    clearInterval(this.#timer);
    this.#timer = undefined;
    this.#port = undefined;
    this.#pending = '';
  }

  #sendReading(): void {
    const port = this.#port;
    if (!port) return;
    try {
      port.send(encodeIndicatorLine(this.#profile, this.options.read()));
    } catch (error) {
      // A reading the display cannot show (too wide, or negative on an unsigned format): no line.
      debug('%s: %s', this.#profile.id, (error as Error).message);
    }
  }
}
