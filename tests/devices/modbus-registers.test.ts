import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { modbusProfileSchema } from '@shared/devices/schema';
import { holdingInt16Transducer, inputFloat32HighFirstTransducer, inputFloat32Transducer } from '@shared/devices/default-profiles';
import { modbusReading, profileReadRequest, rawForReading, registersToValue, valueToRegisters } from '../../devices/modbus/registers';

describe('registersToValue', () => {
  it.each([
    // Two's complement 16-bit: 0xFFFF = −1, 0x8000 = −32768 (definition of two's complement).
    [[0xffff], 'int16', 'high-first', -1],
    [[0x8000], 'int16', 'high-first', -32768],
    [[0xffff], 'uint16', 'high-first', 65535],
    // Application Protocol §6.3 example: register 108 holds 0x022B = 555 (from memory).
    [[0x022b], 'uint16', 'high-first', 555],
    [[0x0001, 0x0000], 'int32', 'high-first', 65536],
    [[0x0000, 0x0001], 'int32', 'low-first', 65536],
    [[0xffff, 0xfffe], 'int32', 'high-first', -2],
    [[0xfffe, 0xffff], 'int32', 'low-first', -2],
    [[0xffff, 0xffff], 'uint32', 'high-first', 4294967295],
    // IEEE 754 binary32: 1.0 = 0x3F800000, −2.5 = 0xC0200000 (IEEE 754-2008 encoding; from memory).
    [[0x3f80, 0x0000], 'float32', 'high-first', 1],
    [[0x0000, 0x3f80], 'float32', 'low-first', 1],
    [[0xc020, 0x0000], 'float32', 'high-first', -2.5],
  ] as const)('%j as %s %s → %d', (regs, format, order, value) => {
    expect(registersToValue(regs, format, order)).toBe(value);
  });

  it('agrees with Node Buffer reads of the same big-endian bytes', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 0xffff }), fc.integer({ min: 0, max: 0xffff }), (hi, lo) => {
        const bytes = Buffer.from([hi >> 8, hi & 0xff, lo >> 8, lo & 0xff]);
        expect(registersToValue([hi, lo], 'int32')).toBe(bytes.readInt32BE(0));
        expect(registersToValue([lo, hi], 'uint32', 'low-first')).toBe(bytes.readUInt32BE(0));
        expect(Object.is(registersToValue([hi, lo], 'float32'), bytes.readFloatBE(0))).toBe(true);
        expect(registersToValue([hi], 'int16')).toBe(bytes.readInt16BE(0));
      }),
    );
  });

  it('reads a high-word-first float with the high-first profile, and shows what the low-first one makes of it', () => {
    // 12.5 = 0x41480000 in IEEE 754 binary32 (sign 0, exponent 130, fraction 0.5625; from memory).
    expect(registersToValue([0x4148, 0x0000], 'float32', 'high-first')).toBe(12.5);
    expect(modbusReading(inputFloat32HighFirstTransducer, [0x4148, 0x0000])).toMatchObject({ ok: true, value: 12.5 });
    // The same registers read low word first: 0x00004148, a subnormal near 2.34e-41, what a wrong convention shows.
    const misread = Buffer.from([0x00, 0x00, 0x41, 0x48]).readFloatBE(0);
    expect(registersToValue([0x4148, 0x0000], 'float32', 'low-first')).toBe(misread);
    // That is a subnormal float (below 2^-126): no instrument sends one, so it is refused with the likely cause, never "ok".
    expect(misread).toBeLessThan(2 ** -126);
    expect(modbusReading(inputFloat32Transducer, [0x4148, 0x0000])).toMatchObject({ ok: false, problem: { kind: 'value', detail: expect.stringMatching(/subnormal.*word or byte order/) } });
    // A true zero is a reading.
    expect(modbusReading(inputFloat32Transducer, [0x0000, 0x0000])).toMatchObject({ ok: true, value: 0 });
  });

  it('swaps the bytes within each register when the profile says so', () => {
    expect(registersToValue([0x4841, 0x0000], 'float32', 'high-first', 'swapped')).toBe(12.5);
    expect(registersToValue([0x0000, 0x4841], 'float32', 'low-first', 'swapped')).toBe(12.5);
    expect(registersToValue([0x2b02], 'uint16', 'high-first', 'swapped')).toBe(555);
    expect(valueToRegisters(12.5, 'float32', 'low-first', 'swapped')).toEqual([0x0000, 0x4841]);
  });

  it('refuses the wrong number of registers', () => {
    expect(() => registersToValue([1], 'float32')).toThrow(/2 register/);
  });
});

describe('valueToRegisters', () => {
  it('round-trips every format and word order', () => {
    const formats = [
      ['int16', fc.integer({ min: -32768, max: 32767 })],
      ['uint16', fc.integer({ min: 0, max: 65535 })],
      ['int32', fc.integer({ min: -(2 ** 31), max: 2 ** 31 - 1 })],
      ['uint32', fc.integer({ min: 0, max: 2 ** 32 - 1 })],
      ['float32', fc.float({ noNaN: true }).map(Math.fround)],
    ] as const;
    for (const [format, values] of formats) {
      fc.assert(
        fc.property(values, fc.constantFrom('high-first', 'low-first' as const), fc.constantFrom('big', 'swapped' as const), (value, order, bytes) => {
          expect(registersToValue(valueToRegisters(value, format, order, bytes), format, order, bytes)).toBe(value);
        }),
      );
    }
  });

  it('refuses integers out of range, naming the format', () => {
    expect(() => valueToRegisters(32768, 'int16')).toThrow(/int16/);
    expect(() => valueToRegisters(-1, 'uint32')).toThrow(/uint32/);
    expect(() => valueToRegisters(1.5, 'int32')).toThrow(/int32/);
  });
});

describe('profile readings', () => {
  it('scales the raw value: int16 × 0.1 bar', () => {
    expect(profileReadRequest(holdingInt16Transducer)).toEqual({ unitId: 1, functionCode: 3, address: 0, quantity: 1 });
    expect(modbusReading(holdingInt16Transducer, [3930])).toEqual({ ok: true, raw: 3930, value: 393 });
    expect(modbusReading(holdingInt16Transducer, [0xffff])).toMatchObject({ ok: true, value: -0.1 });
  });

  it('applies scale and offset', () => {
    const profile = modbusProfileSchema.parse({ ...holdingInt16Transducer, format: 'uint16', scale: 0.01, offset: -1.5, unit: 'MPa' });
    expect(modbusReading(profile, [500])).toMatchObject({ ok: true, value: 3.5 });
    expect(rawForReading(profile, 3.5)).toBe(500);
  });

  it('reads a low-word-first float and refuses NaN or infinity as a reading', () => {
    expect(profileReadRequest(inputFloat32Transducer)).toEqual({ unitId: 2, functionCode: 4, address: 2, quantity: 2 });
    expect(modbusReading(inputFloat32Transducer, valueToRegisters(3.25, 'float32', 'low-first'))).toMatchObject({ ok: true, value: 3.25 });
    expect(modbusReading(inputFloat32Transducer, [0x0000, 0x7fc0])).toMatchObject({ ok: false, reason: /not a finite number/ });
    expect(modbusReading(inputFloat32Transducer, [0x0000, 0x7f80])).toMatchObject({ ok: false });
  });
});
