/*
 * Why a device gave no trusted reading, as data: the device layer names the cause once and every
 * view (device check, logs) words it with describeDeviceProblem(), so a wrong register never reads
 * as line noise.
 */

/** Modbus exception codes ("MODBUS Application Protocol Specification V1.1b3" §7). */
export const MODBUS_EXCEPTION_NAMES: Record<number, string> = {
  1: 'illegal function',
  2: 'illegal data address',
  3: 'illegal data value',
  4: 'server device failure',
  5: 'acknowledge',
  6: 'server device busy',
  8: 'memory parity error',
  10: 'gateway path unavailable',
  11: 'gateway target device failed to respond',
};

/** What each exception usually means for a profile, so the reader knows what to check. */
const EXCEPTION_HINTS: Record<number, string> = {
  1: "the device does not support this function code: check the profile's function (03 holding / 04 input)",
  2: "the device has no such register: check the profile's register and data type",
  3: 'the device refused the request values: check the register count for the data type',
};

export type DeviceProblem =
  /** A well-formed Modbus exception reply. */
  | { kind: 'exception'; code: number }
  /** Bytes arrived whose CRC does not hold: damaged on the line, or wrong serial settings. */
  | { kind: 'crc' }
  /** A frame or line of the wrong shape (length, unit, function, byte count, pattern). */
  | { kind: 'framing'; detail: string }
  /** A well-formed frame whose value cannot be a reading (NaN, infinite). */
  | { kind: 'value'; detail: string }
  /** No answer (polled) or no line (streaming) within the profile's timeout. */
  | { kind: 'timeout' }
  /** The port has never opened since the reader started. */
  | { kind: 'port-never-opened'; detail: string }
  /** The port was open and is gone. */
  | { kind: 'port-lost'; detail: string }
  /** A reading outside the range the instrument register gives. */
  | { kind: 'outside-range'; detail: string };

/** Two-digit exception code as devices' manuals print it: 2 → "02". */
export const exceptionCodeText = (code: number) => code.toString(16).toUpperCase().padStart(2, '0');

/** The problem in words for the device check page. */
export function describeDeviceProblem(p: DeviceProblem): string {
  switch (p.kind) {
    case 'exception': {
      const name = MODBUS_EXCEPTION_NAMES[p.code] ?? 'unknown exception';
      const hint = EXCEPTION_HINTS[p.code];
      return `Modbus exception ${exceptionCodeText(p.code)} (${name})${hint ? `: ${hint}` : ''}`;
    }
    case 'crc':
      return 'CRC error: the reply was damaged on the line (check cable, baud rate, parity)';
    case 'framing':
      return `Framing error: ${p.detail}`;
    case 'value':
      return `Unusable value: ${p.detail}`;
    case 'timeout':
      return 'No answer within the timeout (check port, slave id, wiring and serial settings)';
    case 'port-never-opened':
      return `Port never opened: ${p.detail}`;
    case 'port-lost':
      return `Port lost: ${p.detail}`;
    case 'outside-range':
      return `Outside the instrument's range: ${p.detail}`;
  }
}
