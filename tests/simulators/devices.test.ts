import { holdingInt16Transducer, inputFloat32Transducer, statusCountsIndicator } from '@shared/devices/default-profiles';
import type { ModbusProfile } from '@shared/devices/schema';
import { describe, expect, it } from 'vitest';
import { encodeIndicatorLine } from '../../devices/ascii/encode';
import { parseIndicatorLine } from '../../devices/ascii/parse';
import { withCrc } from '../../devices/modbus/crc16';
import { decodeReadResponse, encodeReadRequest } from '../../devices/modbus/frames';
import { modbusReading, profileReadRequest } from '../../devices/modbus/registers';
import { takeRequests } from '../../simulators/devices/ascii-indicator';
import { FaultBoard } from '../../simulators/devices/faults';
import { registersFor, replyTo, splitFrames } from '../../simulators/devices/modbus-transducer';

describe('polled indicator requests', () => {
  it('counts whole requests and keeps only a possible start of the next', () => {
    expect(takeRequests('?\r?\r?', '?\r')).toEqual({ count: 2, rest: '?' });
    expect(takeRequests('noise without end', '?\r')).toEqual({ count: 0, rest: 'd' });
    expect(takeRequests('', '?\r')).toEqual({ count: 0, rest: '' });
  });

  it('streams lines that the application parser reads back (counts profile, sign −1)', () => {
    const line = encodeIndicatorLine(statusCountsIndicator, 12.3455);
    const parsed = parseIndicatorLine(statusCountsIndicator, line.slice(0, -statusCountsIndicator.terminator.length));
    expect(parsed.ok && parsed.valueMm).toBeCloseTo(12.3455, 4);
  });
});

describe('Modbus RTU transducer', () => {
  const request = (profile: ModbusProfile) => encodeReadRequest(profileReadRequest(profile));

  it('answers its own read with the value encoded per the profile (int16 × 0.1 bar)', () => {
    const reply = replyTo(holdingInt16Transducer, request(holdingInt16Transducer), () => 123.46);
    const decoded = decodeReadResponse(reply ?? new Uint8Array(), profileReadRequest(holdingInt16Transducer));
    if (!decoded.ok) throw new Error(decoded.reason);
    const reading = modbusReading(holdingInt16Transducer, decoded.registers);
    expect(reading.ok && reading.value).toBeCloseTo(123.5, 9);
  });

  it('answers float32 input registers, low word first', () => {
    const reply = replyTo(inputFloat32Transducer, request(inputFloat32Transducer), () => 12.375);
    const decoded = decodeReadResponse(reply ?? new Uint8Array(), profileReadRequest(inputFloat32Transducer));
    if (!decoded.ok) throw new Error(decoded.reason);
    const reading = modbusReading(inputFloat32Transducer, decoded.registers);
    expect(reading.ok && reading.value).toBe(12.375);
  });

  it('stays silent for another unit or a corrupted frame, as RTU servers must', () => {
    const other = encodeReadRequest({ ...profileReadRequest(holdingInt16Transducer), unitId: 9 });
    expect(replyTo(holdingInt16Transducer, other, () => 1)).toBeUndefined();
    const corrupted = request(holdingInt16Transducer);
    corrupted[3] ^= 0x01;
    expect(replyTo(holdingInt16Transducer, corrupted, () => 1)).toBeUndefined();
  });

  it('answers exceptions: 01 for another function, 02 for an address it lacks', () => {
    const wrongFunction = encodeReadRequest({ ...profileReadRequest(holdingInt16Transducer), functionCode: 4 });
    expect(Array.from(replyTo(holdingInt16Transducer, wrongFunction, () => 1) ?? []).slice(0, 3)).toEqual([1, 0x84, 1]);
    const writeRegister = withCrc(Uint8Array.of(1, 6, 0, 0, 0, 5));
    expect(Array.from(replyTo(holdingInt16Transducer, writeRegister, () => 1) ?? []).slice(0, 3)).toEqual([1, 0x86, 1]);
    const beyond = encodeReadRequest({ ...profileReadRequest(holdingInt16Transducer), address: 1 });
    expect(Array.from(replyTo(holdingInt16Transducer, beyond, () => 1) ?? []).slice(0, 3)).toEqual([1, 0x83, 2]);
  });

  it('saturates instead of wrapping when a value leaves the integer format', () => {
    const unsigned: ModbusProfile = { ...holdingInt16Transducer, format: 'uint16' };
    expect(registersFor(unsigned, -0.3)).toEqual([0]);
    expect(registersFor(holdingInt16Transducer, 99_999)).toEqual([0x7fff]);
    expect(registersFor(holdingInt16Transducer, -99_999)).toEqual([0x8000]);
  });

  it('splits back-to-back requests and discards noise', () => {
    const one = request(holdingInt16Transducer);
    const two = Uint8Array.from([...one, ...one]);
    expect(splitFrames(two)).toHaveLength(2);
    expect(splitFrames(Uint8Array.of(1, 2, 3, 4, 5, 6, 7, 8, 9))).toHaveLength(0);
  });
});

describe('fault board', () => {
  it('shows a fault for its duration of wall time, then forgets it', () => {
    let wall = 0;
    const board = new FaultBoard(() => wall);
    board.set('drop', 2);
    expect(board.has('drop')).toBe(true);
    expect(board.has('garbage')).toBe(false);
    wall = 1_500;
    expect(board.list()).toEqual([{ kind: 'drop', remainingS: 0.5 }]);
    wall = 2_001;
    expect(board.has('drop')).toBe(false);
    expect(() => board.set('split', 0)).toThrow(/"durationS"/);
  });
});
