import type { ModbusProfile } from '@shared/devices/schema';
import type { FrameCheck, ReadRequest } from './frames';

/*
 * Register contents → numbers. Each 16-bit register is big-endian on the wire (Application Protocol
 * Specification §4.2); 32-bit values span two registers whose order varies by device (`wordOrder`).
 */

export type RegisterFormat = ModbusProfile['format'];
export type WordOrder = ModbusProfile['wordOrder'];
export type ByteOrder = ModbusProfile['byteOrder'];

/** A register with its two bytes exchanged (for devices that send the low byte first). */
const swapBytes = (word: number) => ((word & 0xff) << 8) | (word >> 8);

/** Registers a value of this format occupies. */
export function registerCount(format: RegisterFormat): 1 | 2 {
  return format === 'int16' || format === 'uint16' ? 1 : 2;
}

/** The request that reads one value of this profile. */
export function profileReadRequest(profile: ModbusProfile): ReadRequest {
  return { unitId: profile.unitId, functionCode: profile.functionCode, address: profile.register, quantity: registerCount(profile.format) };
}

/** Decodes `registers` (16-bit words in wire order) as one value. */
export function registersToValue(registers: readonly number[], format: RegisterFormat, wordOrder: WordOrder = 'high-first', byteOrder: ByteOrder = 'big'): number {
  const count = registerCount(format);
  if (registers.length !== count) throw new RangeError(`${format} needs ${count} register(s), got ${registers.length}`);
  const view = new DataView(new ArrayBuffer(4));
  const ordered = count === 2 && wordOrder === 'low-first' ? [registers[1], registers[0]] : registers;
  const words = byteOrder === 'swapped' ? ordered.map(swapBytes) : ordered;
  words.forEach((word, i) => {
    view.setUint16(i * 2, word);
  });
  switch (format) {
    case 'int16':
      return view.getInt16(0);
    case 'uint16':
      return view.getUint16(0);
    case 'int32':
      return view.getInt32(0);
    case 'uint32':
      return view.getUint32(0);
    case 'float32':
      return view.getFloat32(0);
  }
}

const INTEGER_RANGE: Partial<Record<RegisterFormat, [number, number]>> = {
  int16: [-0x8000, 0x7fff],
  uint16: [0, 0xffff],
  int32: [-0x80000000, 0x7fffffff],
  uint32: [0, 0xffffffff],
};

/** Encodes one value as registers in wire order (the server side of {@link registersToValue}). */
export function valueToRegisters(value: number, format: RegisterFormat, wordOrder: WordOrder = 'high-first', byteOrder: ByteOrder = 'big'): number[] {
  const range = INTEGER_RANGE[format];
  if (range && (!Number.isInteger(value) || value < range[0] || value > range[1])) {
    throw new RangeError(`${value} is not a ${format} (${range[0]}…${range[1]})`);
  }
  const view = new DataView(new ArrayBuffer(4));
  if (format === 'int16') view.setInt16(0, value);
  else if (format === 'uint16') view.setUint16(0, value);
  else if (format === 'int32') view.setInt32(0, value);
  else if (format === 'uint32') view.setUint32(0, value);
  else view.setFloat32(0, value);
  const swap = (words: number[]) => (byteOrder === 'swapped' ? words.map(swapBytes) : words);
  if (registerCount(format) === 1) return swap([view.getUint16(0)]);
  const words = [view.getUint16(0), view.getUint16(2)];
  return swap(wordOrder === 'low-first' ? [words[1], words[0]] : words);
}

/** Smallest normal IEEE 754 binary32 magnitude, 2^-126. */
const FLOAT32_MIN_NORMAL = 2 ** -126;

/**
 * The profile's reading from its registers, in the profile's unit: raw × scale + offset. A float
 * that is NaN or infinite (a device's "no reading") is a failure, never a number.
 */
export function modbusReading(profile: ModbusProfile, registers: readonly number[]): FrameCheck<{ raw: number; value: number }> {
  const raw = registersToValue(registers, profile.format, profile.wordOrder, profile.byteOrder);
  if (!Number.isFinite(raw)) {
    const reason = `register value ${raw} is not a finite number`;
    return { ok: false, reason, problem: { kind: 'value', detail: reason } };
  }
  if (profile.format === 'float32' && raw !== 0 && Math.abs(raw) < FLOAT32_MIN_NORMAL) {
    // A measured value never lands among the subnormals; the halves of a float read in the wrong order often do.
    const reason = `register value ${raw.toPrecision(3)} is a subnormal float, which no instrument sends: the word or byte order is probably wrong`;
    return { ok: false, reason, problem: { kind: 'value', detail: reason } };
  }
  return { ok: true, raw, value: raw * profile.scale + profile.offset };
}

/** The raw register value a device must hold so that the profile reads `value` (for simulators). */
export function rawForReading(profile: ModbusProfile, value: number): number {
  if (profile.scale === 0) throw new RangeError('"scale" is 0: every raw value reads the same');
  const raw = (value - profile.offset) / profile.scale;
  return profile.format === 'float32' ? raw : Math.round(raw);
}
