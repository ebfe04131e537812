import { type DeviceProblem, MODBUS_EXCEPTION_NAMES } from '@shared/devices/problems';
import { hasValidCrc, withCrc } from './crc16';

/*
 * Modbus RTU frames for reading registers: function 03 (holding) and 04 (input registers), per the
 * "MODBUS Application Protocol Specification V1.1b3" §6.3–6.4 and §7 (exceptions), framed as in
 * "MODBUS over Serial Line Specification and Implementation Guide V1.02" §2.5.1 (address, PDU, CRC).
 */

export type ReadFunctionCode = 3 | 4;

export interface ReadRequest {
  /** Server address, 1–247 (0 is broadcast, which has no reply). */
  unitId: number;
  functionCode: ReadFunctionCode;
  /** First register, 0-based protocol address (0–65535). */
  address: number;
  /** Number of registers, 1–125. */
  quantity: number;
}

/** A failure names its cause as data (`problem`) besides the short `reason` kept in logs and stats. */
export type FrameCheck<T> = ({ ok: true } & T) | { ok: false; reason: string; problem: DeviceProblem; exceptionCode?: number };

/** Exception codes, Application Protocol Specification §7. */
export const EXCEPTION_NAMES = MODBUS_EXCEPTION_NAMES;

const framing = (reason: string) => ({ ok: false as const, reason, problem: { kind: 'framing' as const, detail: reason } });
const CRC_MISMATCH = { ok: false as const, reason: 'CRC mismatch', problem: { kind: 'crc' as const } };

const EXCEPTION_FRAME_LENGTH = 5;
const MAX_QUANTITY = 125;

function checkRequest({ unitId, functionCode, address, quantity }: ReadRequest): string | undefined {
  if (!Number.isInteger(unitId) || unitId < 1 || unitId > 247) return `"unitId" ${unitId} is not 1–247`;
  if (functionCode !== 3 && functionCode !== 4) return `"functionCode" ${functionCode} is not 3 or 4`;
  if (!Number.isInteger(quantity) || quantity < 1 || quantity > MAX_QUANTITY) return `"quantity" ${quantity} is not 1–${MAX_QUANTITY}`;
  if (!Number.isInteger(address) || address < 0 || address + quantity > 0x10000) return `"address" ${address} (+${quantity}) is outside 0–65535`;
  return undefined;
}

/** The 8-byte request frame: unit, function, address (big-endian), quantity (big-endian), CRC. */
export function encodeReadRequest(request: ReadRequest): Uint8Array {
  const problem = checkRequest(request);
  if (problem) throw new RangeError(problem);
  const { unitId, functionCode, address, quantity } = request;
  return withCrc(Uint8Array.of(unitId, functionCode, address >> 8, address & 0xff, quantity >> 8, quantity & 0xff));
}

/** Server side: reads a request frame (what a simulated transducer receives). */
export function decodeReadRequest(frame: Uint8Array): FrameCheck<{ request: ReadRequest }> {
  if (frame.length !== 8) return framing(`request is ${frame.length} bytes, not 8`);
  if (!hasValidCrc(frame)) return CRC_MISMATCH;
  const request = { unitId: frame[0], functionCode: frame[1] as ReadFunctionCode, address: (frame[2] << 8) | frame[3], quantity: (frame[4] << 8) | frame[5] };
  const problem = checkRequest(request);
  return problem ? framing(problem) : { ok: true, request };
}

/** Server side: the normal reply carrying `registers` (each 0–65535). */
export function encodeReadResponse(unitId: number, functionCode: ReadFunctionCode, registers: readonly number[]): Uint8Array {
  if (registers.length < 1 || registers.length > MAX_QUANTITY) throw new RangeError(`"registers" must hold 1–${MAX_QUANTITY} values`);
  const body = new Uint8Array(3 + registers.length * 2);
  body.set([unitId, functionCode, registers.length * 2]);
  registers.forEach((word, i) => {
    if (!Number.isInteger(word) || word < 0 || word > 0xffff) throw new RangeError(`register ${i} value ${word} is not 0–65535`);
    body[3 + i * 2] = word >> 8;
    body[4 + i * 2] = word & 0xff;
  });
  return withCrc(body);
}

/** Server side: an exception reply (function code with its top bit set, then the exception code). */
export function encodeExceptionResponse(unitId: number, functionCode: ReadFunctionCode, exceptionCode: number): Uint8Array {
  return withCrc(Uint8Array.of(unitId, functionCode | 0x80, exceptionCode));
}

/**
 * Length the reply to `request` will have, judged from its first two bytes: an exception reply is
 * 5 bytes, a normal one 5 + 2·quantity. With fewer than two bytes the normal length is assumed.
 */
export function expectedResponseLength(received: Uint8Array, request: ReadRequest): number {
  if (received.length >= 2 && received[1] === (request.functionCode | 0x80)) return EXCEPTION_FRAME_LENGTH;
  return 5 + 2 * request.quantity;
}

/**
 * Client side: checks a reply frame against the request it answers (CRC, address, function, byte
 * count, length) and returns its registers. Exception replies are failures with `exceptionCode`.
 */
export function decodeReadResponse(frame: Uint8Array, request: ReadRequest): FrameCheck<{ registers: number[] }> {
  if (frame.length < EXCEPTION_FRAME_LENGTH) return framing(`reply is only ${frame.length} bytes`);
  if (!hasValidCrc(frame)) return CRC_MISMATCH;
  if (frame[0] !== request.unitId) return framing(`reply from unit ${frame[0]}, expected ${request.unitId}`);
  if (frame[1] === (request.functionCode | 0x80) && frame.length === EXCEPTION_FRAME_LENGTH) {
    const code = frame[2];
    return { ok: false, reason: `exception ${code} (${EXCEPTION_NAMES[code] ?? 'unknown'})`, problem: { kind: 'exception', code }, exceptionCode: code };
  }
  if (frame[1] !== request.functionCode) return framing(`function ${frame[1]} in reply, expected ${request.functionCode}`);
  const byteCount = frame[2];
  if (byteCount !== 2 * request.quantity) return framing(`byte count ${byteCount}, expected ${2 * request.quantity}`);
  if (frame.length !== 5 + byteCount) return framing(`reply is ${frame.length} bytes, expected ${5 + byteCount}`);
  const registers: number[] = [];
  for (let i = 0; i < request.quantity; i++) registers.push((frame[3 + i * 2] << 8) | frame[4 + i * 2]);
  return { ok: true, registers };
}

/**
 * Client side: the first frame in `received` that is a well-formed reply to `request` (normal or
 * exception, CRC valid), with the number of bytes of noise before it. Lets a reply be found after
 * line noise; without a valid CRC nothing is ever taken for a reply.
 */
export function findResponseFrame(received: Uint8Array, request: ReadRequest): { frame: Uint8Array; skipped: number } | undefined {
  for (let start = 0; start + EXCEPTION_FRAME_LENGTH <= received.length; start++) {
    if (received[start] !== request.unitId) continue;
    const rest = received.subarray(start);
    const length = expectedResponseLength(rest, request);
    if (rest.length < length) continue;
    const frame = rest.subarray(0, length);
    const check = decodeReadResponse(frame, request);
    if (check.ok || check.exceptionCode !== undefined) return { frame, skipped: start };
  }
  return undefined;
}
