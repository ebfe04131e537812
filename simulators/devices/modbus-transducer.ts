import type { ModbusProfile } from '@shared/devices/schema';
import { hasValidCrc, withCrc } from '../../devices/modbus/crc16';
import { decodeReadRequest, encodeExceptionResponse, encodeReadResponse } from '../../devices/modbus/frames';
import { rawForReading, registerCount, valueToRegisters } from '../../devices/modbus/registers';
import type { DevicePort } from './device-port';
import type { FaultBoard } from './faults';

/** Options of {@link SimulatedTransducer}. */
export interface SimulatedTransducerOptions {
  /** Unit id, function code, register, format and scaling, as the application's reader knows them. */
  profile: ModbusProfile;
  /** The value to serve now, in the profile's unit. */
  read: () => number;
  /** The device's faults; 'bad-crc' is applied here. */
  faults: FaultBoard;
  /** Silence that ends a request frame, ms (3.5 characters at 9600 Bd ≈ 4 ms). Defaults to 4. */
  frameGapMs?: number;
}

const REQUEST_LENGTH = 8;
const ILLEGAL_FUNCTION = 1;
const ILLEGAL_DATA_ADDRESS = 2;
const ILLEGAL_DATA_VALUE = 3;

/** Integer register formats saturate like a real transducer's output instead of wrapping. */
const SATURATION: Partial<Record<ModbusProfile['format'], [number, number]>> = {
  int16: [-0x8000, 0x7fff],
  uint16: [0, 0xffff],
  int32: [-0x80000000, 0x7fffffff],
  uint32: [0, 0xffffffff],
};

/** The registers that hold `value` for this profile, in wire order. */
export function registersFor(profile: ModbusProfile, value: number): number[] {
  const raw = rawForReading(profile, value);
  const range = SATURATION[profile.format];
  const held = range ? Math.min(Math.max(raw, range[0]), range[1]) : raw;
  return valueToRegisters(held, profile.format, profile.wordOrder, profile.byteOrder);
}

/**
 * The reply a transducer of this profile gives to one received RTU frame, or undefined when it
 * must stay silent (bad CRC, another unit, broadcast), per the Modbus serial-line rules.
 */
export function replyTo(profile: ModbusProfile, frame: Uint8Array, value: () => number): Uint8Array | undefined {
  if (!hasValidCrc(frame) || frame[0] !== profile.unitId) return undefined;
  const functionCode = frame[1];
  if (functionCode !== profile.functionCode) return withCrc(Uint8Array.of(profile.unitId, functionCode | 0x80, ILLEGAL_FUNCTION));
  const decoded = decodeReadRequest(frame);
  if (!decoded.ok) return encodeExceptionResponse(profile.unitId, profile.functionCode, ILLEGAL_DATA_VALUE);
  const { address, quantity } = decoded.request;
  const first = profile.register;
  if (address < first || address + quantity > first + registerCount(profile.format)) {
    return encodeExceptionResponse(profile.unitId, profile.functionCode, ILLEGAL_DATA_ADDRESS);
  }
  const registers = registersFor(profile, value()).slice(address - first, address - first + quantity);
  return encodeReadResponse(profile.unitId, profile.functionCode, registers);
}

/** Cuts received bytes into request frames: the whole burst when its CRC holds, else 8-byte read requests. */
export function splitFrames(burst: Uint8Array): Uint8Array[] {
  if (hasValidCrc(burst)) return [burst];
  const frames: Uint8Array[] = [];
  for (let at = 0; at + REQUEST_LENGTH <= burst.length; at += REQUEST_LENGTH) {
    const frame = burst.subarray(at, at + REQUEST_LENGTH);
    if (!hasValidCrc(frame)) break; // noise: the rest of the burst is discarded
    frames.push(frame);
  }
  return frames;
}

/**
 * A pressure transducer (or load cell) answering Modbus RTU read requests, function 03 or 04 as
 * its profile says, with the current value encoded in the profile's format. Frames end after a
 * silence, as on a real line.
 */
export class SimulatedTransducer {
  #pending = Buffer.alloc(0);
  #gapTimer?: NodeJS.Timeout;
  #port?: DevicePort;

  constructor(private readonly options: SimulatedTransducerOptions) {}

  receive(chunk: Buffer): void {
    this.#pending = Buffer.concat([this.#pending, chunk]);
    if (this.#pending.length > 256) this.#pending = this.#pending.subarray(-256); // an RTU frame is at most 256 bytes
    clearTimeout(this.#gapTimer);
    this.#gapTimer = setTimeout(() => this.#endOfFrame(), this.options.frameGapMs ?? 4);
  }

  attach(port: DevicePort): void {
    this.detach();
    this.#port = port;
  }

  detach(): void {
    clearTimeout(this.#gapTimer);
    this.#pending = Buffer.alloc(0);
    this.#port = undefined;
  }

  #endOfFrame(): void {
    const burst = this.#pending;
    this.#pending = Buffer.alloc(0);
    for (const frame of splitFrames(burst)) {
      const reply = replyTo(this.options.profile, frame, this.options.read);
      if (reply) this.#port?.send(this.options.faults.has('bad-crc') ? corruptCrc(reply) : reply);
    }
  }
}

/** The same frame with its CRC bytes flipped. */
function corruptCrc(frame: Uint8Array): Uint8Array {
  const bad = Uint8Array.from(frame);
  bad[bad.length - 1] ^= 0xff;
  bad[bad.length - 2] ^= 0x5a;
  return bad;
}
