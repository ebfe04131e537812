import fc from 'fast-check';
import { createRequire } from 'node:module';
import { describeDeviceProblem } from '@shared/devices/problems';
import { describe, expect, it } from 'vitest';
import { crc16, hasValidCrc, withCrc } from '../../devices/modbus/crc16';
import {
  decodeReadRequest,
  decodeReadResponse,
  encodeExceptionResponse,
  encodeReadRequest,
  encodeReadResponse,
  findResponseFrame,
  type ReadRequest,
} from '../../devices/modbus/frames';
import { hexBytes } from '../../devices/readers/modbus-transducer-reader';

// modbus-serial's own CRC routine: an independent implementation to check ours against.
const modbusSerialCrc16 = createRequire(import.meta.url)('modbus-serial/utils/crc16') as (bytes: Buffer) => number;

const hex = (text: string) => Uint8Array.from(Buffer.from(text.replace(/ /g, ''), 'hex'));

describe('CRC-16/MODBUS', () => {
  it.each([
    // Standard check value of CRC-16/MODBUS over the ASCII string "123456789" (CRC catalogue; from memory).
    ['31 32 33 34 35 36 37 38 39', 0x4b37],
    // "MODBUS over Serial Line … V1.02", appendix B CRC example: frame 02 07 → CRC 0x1241, sent 41 12 (from memory).
    ['02 07', 0x1241],
    // Read one holding register at 0 from unit 1: 01 03 00 00 00 01 84 0A (common test frame; from memory).
    ['01 03 00 00 00 01', 0x0a84],
    // Application Protocol V1.1b3 §6.3 example (registers 108–110) sent to unit 17 as RTU:
    // 11 03 00 6B 00 03 76 87 (seen reproduced at bbs.21ic.com/icview-162927-1-1.html).
    ['11 03 00 6B 00 03', 0x8776],
  ])('%s → %s', (body, crc) => {
    expect(crc16(hex(body))).toBe(crc);
  });

  it('appends the CRC low byte first and checks it', () => {
    expect(hexBytes(withCrc(hex('11 03 00 6B 00 03')))).toBe('11 03 00 6B 00 03 76 87');
    expect(hasValidCrc(hex('11 03 00 6B 00 03 76 87'))).toBe(true);
    expect(hasValidCrc(hex('11 03 00 6B 00 03 87 76'))).toBe(false);
    expect(hasValidCrc(hex('11 03 00 6B 00 04 76 87'))).toBe(false);
  });

  it('agrees with modbus-serial on any bytes', () => {
    fc.assert(fc.property(fc.uint8Array({ maxLength: 300 }), (bytes) => crc16(bytes) === modbusSerialCrc16(Buffer.from(bytes))));
  });

  it('catches every single-byte corruption of a frame', () => {
    fc.assert(
      fc.property(fc.uint8Array({ minLength: 1, maxLength: 60 }), fc.nat(), fc.integer({ min: 1, max: 255 }), (body, at, flip) => {
        const frame = withCrc(body);
        frame[at % frame.length] ^= flip;
        return !hasValidCrc(frame);
      }),
    );
  });
});

const FC03: ReadRequest = { unitId: 0x11, functionCode: 3, address: 0x6b, quantity: 3 };

describe('request frames', () => {
  it('encodes the Application Protocol §6.3 example request as RTU: 11 03 00 6B 00 03 76 87', () => {
    // PDU 03 00 6B 00 03 from the spec's example; the RTU frame as reproduced at bbs.21ic.com (see above).
    expect(hexBytes(encodeReadRequest(FC03))).toBe('11 03 00 6B 00 03 76 87');
  });

  it('encodes the §6.4 example (read input register 9 → address 0x0008) for unit 17', () => {
    // PDU 04 00 08 00 01 from the spec's example (from memory); CRC cross-checked with modbus-serial.
    const frame = encodeReadRequest({ unitId: 0x11, functionCode: 4, address: 8, quantity: 1 });
    expect(hexBytes(frame.subarray(0, 6))).toBe('11 04 00 08 00 01');
    expect(modbusSerialCrc16(Buffer.from(frame.subarray(0, 6)))).toBe(frame[6] | (frame[7] << 8));
  });

  it('refuses out-of-range requests, naming the field', () => {
    expect(() => encodeReadRequest({ ...FC03, unitId: 0 })).toThrow(/"unitId"/);
    expect(() => encodeReadRequest({ ...FC03, unitId: 248 })).toThrow(/"unitId"/);
    expect(() => encodeReadRequest({ ...FC03, quantity: 126 })).toThrow(/"quantity"/);
    expect(() => encodeReadRequest({ ...FC03, address: 65535, quantity: 2 })).toThrow(/"address"/);
    expect(() => encodeReadRequest({ ...FC03, functionCode: 6 as 3 })).toThrow(/"functionCode"/);
  });

  it('decodes requests on the server side and rejects damaged ones', () => {
    expect(decodeReadRequest(hex('11 03 00 6B 00 03 76 87'))).toEqual({ ok: true, request: FC03 });
    expect(decodeReadRequest(hex('11 03 00 6B 00 03 76 88'))).toMatchObject({ ok: false, reason: 'CRC mismatch' });
    expect(decodeReadRequest(withCrc(hex('11 06 00 01 00 03')))).toMatchObject({ ok: false, reason: expect.stringMatching(/functionCode/) });
    expect(decodeReadRequest(hex('11 03 00 6B 00'))).toMatchObject({ ok: false });
  });
});

describe('response frames', () => {
  // Application Protocol §6.3 example reply: byte count 06, registers 108–110 = 02 2B, 00 00, 00 64 (555, 0, 100) (from memory).
  const REPLY = withCrc(hex('11 03 06 02 2B 00 00 00 64'));

  it('decodes the §6.3 example reply', () => {
    expect(decodeReadResponse(REPLY, FC03)).toEqual({ ok: true, registers: [555, 0, 100] });
    expect(encodeReadResponse(0x11, 3, [555, 0, 100])).toEqual(REPLY);
  });

  it('decodes the tutorial reply 11 03 06 AE 41 56 52 43 40 49 AD', () => {
    // Reply to 11 03 00 6B 00 03 in the simplymodbus.ca function-03 tutorial (from memory); CRC agrees with modbus-serial's.
    expect(decodeReadResponse(hex('11 03 06 AE 41 56 52 43 40 49 AD'), FC03)).toEqual({ ok: true, registers: [0xae41, 0x5652, 0x4340] });
  });

  it.each([
    ['bad CRC', () => Uint8Array.from(REPLY, (b, i) => (i === REPLY.length - 1 ? b ^ 1 : b)), /CRC/],
    ['a corrupted data byte', () => Uint8Array.from(REPLY, (b, i) => (i === 4 ? b ^ 0x10 : b)), /CRC/],
    ['wrong address', () => encodeReadResponse(0x12, 3, [555, 0, 100]), /unit 18, expected 17/],
    ['wrong function', () => encodeReadResponse(0x11, 4, [555, 0, 100]), /function 4/],
    ['wrong byte count', () => encodeReadResponse(0x11, 3, [555, 0]), /byte count 4, expected 6/],
    ['a truncated frame', () => REPLY.subarray(0, 4), /only 4 bytes/],
    ['a byte count that disagrees with the length', () => withCrc(hex('11 03 06 02 2B 00 00 00 64 00')), /expected 11/],
  ])('rejects %s', (_, frame, reason) => {
    const result = decodeReadResponse(frame(), FC03);
    expect(result.ok).toBe(false);
    expect(result).not.toHaveProperty('registers');
    if (!result.ok) expect(result.reason).toMatch(reason);
  });

  it('reports exception replies with their code (Application Protocol §7)', () => {
    // §7 example shape: function code + 0x80, then exception code 02 (illegal data address).
    const frame = encodeExceptionResponse(0x11, 3, 2);
    expect(hexBytes(frame.subarray(0, 3))).toBe('11 83 02');
    expect(decodeReadResponse(frame, FC03)).toEqual({ ok: false, reason: 'exception 2 (illegal data address)', problem: { kind: 'exception', code: 2 }, exceptionCode: 2 });
  });

  it('names each failure by its kind: exception, CRC or framing, never one word for all', () => {
    const exception = decodeReadResponse(encodeExceptionResponse(0x11, 3, 2), FC03);
    expect(!exception.ok && describeDeviceProblem(exception.problem)).toMatch(/^Modbus exception 02 \(illegal data address\)/);
    const crc = decodeReadResponse(Uint8Array.from(REPLY, (b, i) => (i === 4 ? b ^ 0x10 : b)), FC03);
    expect(!crc.ok && crc.problem).toEqual({ kind: 'crc' });
    const framing = decodeReadResponse(encodeReadResponse(0x11, 3, [555, 0]), FC03);
    expect(!framing.ok && framing.problem).toEqual({ kind: 'framing', detail: 'byte count 4, expected 6' });
    // An exception of a code the specification does not list is still an exception, not noise.
    const unknown = decodeReadResponse(encodeExceptionResponse(0x11, 3, 0x20), FC03);
    expect(!unknown.ok && describeDeviceProblem(unknown.problem)).toBe('Modbus exception 20 (unknown exception)');
  });

  it('finds a reply behind leading noise and ignores noise that is not a valid frame', () => {
    const noise = hex('FF 11 03 06 00 11 00');
    const found = findResponseFrame(Uint8Array.from([...noise, ...REPLY, 0x00]), FC03);
    expect(found && { skipped: found.skipped, frame: hexBytes(found.frame) }).toEqual({ skipped: noise.length, frame: hexBytes(REPLY) });
    expect(findResponseFrame(REPLY.subarray(0, 10), FC03)).toBeUndefined();
    expect(findResponseFrame(encodeReadResponse(0x12, 3, [1, 2, 3]), FC03)).toBeUndefined();
    expect(findResponseFrame(encodeExceptionResponse(0x11, 3, 4), FC03)?.frame[1]).toBe(0x83);
  });
});
