import type { ModbusProfile } from '@shared/devices/schema';
import { decodeReadResponse, encodeReadRequest, expectedResponseLength, type ReadRequest } from '../modbus/frames';
import { modbusReading, profileReadRequest } from '../modbus/registers';
import { ResponseCollector } from '../modbus/response-collector';
import { DeviceReader, type DeviceReaderOptions } from './device-reader';
import { PollLoop, ReplyWaiter } from './polling';

/** Options of {@link ModbusTransducerReader}. */
export interface ModbusTransducerReaderOptions extends DeviceReaderOptions {
  profile: ModbusProfile;
}

/** Frame bytes as "01 03 02 00 7B F8 67", the `raw` of a Modbus sample. */
export function hexBytes(bytes: Uint8Array): string {
  return Array.from(bytes, (b) => b.toString(16).toUpperCase().padStart(2, '0')).join(' ');
}

/**
 * A pressure transducer or ADC read over Modbus RTU: every `pollIntervalMs` one read request
 * (function 03 or 04), then the reply within `timeoutMs`. Values are raw × scale + offset in the
 * profile's unit. Bytes that are not a CRC-valid reply to the request are never a value.
 */
export class ModbusTransducerReader extends DeviceReader {
  private readonly profile: ModbusProfile;
  private readonly request: ReadRequest;
  private readonly requestFrame: Uint8Array;
  private readonly reply = new ReplyWaiter<Uint8Array>(this.clock);
  private readonly poller: PollLoop;
  private readonly collector = new ResponseCollector();

  constructor(options: ModbusTransducerReaderOptions) {
    super(options, options.profile.serial);
    this.profile = options.profile;
    this.request = profileReadRequest(this.profile);
    this.requestFrame = encodeReadRequest(this.request);
    this.poller = new PollLoop(this.clock, this.profile.pollIntervalMs, () => this.poll());
  }

  protected get droppedBytes(): number {
    return this.collector.noiseBytes;
  }

  protected onData(chunk: Buffer): void {
    const frame = this.collector.push(chunk);
    if (frame) this.reply.deliver(frame);
  }

  protected onLinkUp(): void {
    this.poller.start();
  }

  protected onLinkDown(): void {
    this.poller.stop();
    this.reply.cancel();
    this.collector.end();
  }

  private async poll(): Promise<void> {
    this.collector.begin(this.request);
    const outcome = await this.ask(this.reply, this.requestFrame, this.profile.timeoutMs);
    this.collector.end();
    if (outcome.kind === 'reply') this.record(outcome.value);
    else if (outcome.kind === 'timeout') this.recordTimeout();
  }

  private record(frame: Uint8Array): void {
    const raw = hexBytes(frame);
    const check = decodeReadResponse(frame, this.request);
    if (!check.ok) {
      this.samples.reject(raw, check.reason, check.problem);
      return;
    }
    const reading = modbusReading(this.profile, check.registers);
    if (reading.ok) this.samples.ok(raw, reading.value);
    else this.samples.reject(raw, reading.reason, reading.problem);
  }

  /** Silence is a timeout; bytes that never formed a valid reply are a rejected frame. */
  private recordTimeout(): void {
    const bytes = this.collector.received;
    if (bytes.length === 0) {
      this.samples.timeout();
    } else {
      const head = bytes.subarray(0, expectedResponseLength(bytes, this.request));
      const check = decodeReadResponse(head, this.request);
      if (check.ok) this.samples.reject(hexBytes(bytes), 'reply incomplete');
      else this.samples.reject(hexBytes(bytes), check.reason, check.problem);
    }
  }
}
