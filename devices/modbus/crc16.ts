/*
 * CRC-16 of Modbus RTU ("MODBUS over Serial Line Specification and Implementation Guide V1.02",
 * §6.2.2): polynomial 0xA001 (0x8005 reflected), initial value 0xFFFF, no final XOR. The CRC is
 * sent low byte first, so the last two bytes of a frame read as a little-endian 16-bit number.
 */

const TABLE = (() => {
  const table = new Uint16Array(256);
  for (let n = 0; n < 256; n++) {
    let crc = n;
    for (let bit = 0; bit < 8; bit++) crc = crc & 1 ? (crc >>> 1) ^ 0xa001 : crc >>> 1;
    table[n] = crc;
  }
  return table;
})();

/** CRC-16/MODBUS of `bytes`. */
export function crc16(bytes: Uint8Array): number {
  let crc = 0xffff;
  for (const byte of bytes) crc = (crc >>> 8) ^ TABLE[(crc ^ byte) & 0xff];
  return crc;
}

/** `body` followed by its CRC, low byte first: a complete RTU frame. */
export function withCrc(body: Uint8Array): Uint8Array {
  const frame = new Uint8Array(body.length + 2);
  frame.set(body);
  const crc = crc16(body);
  frame[body.length] = crc & 0xff;
  frame[body.length + 1] = crc >>> 8;
  return frame;
}

/** True when the frame's last two bytes are the CRC of the bytes before them. */
export function hasValidCrc(frame: Uint8Array): boolean {
  if (frame.length < 3) return false;
  const body = frame.subarray(0, frame.length - 2);
  const crc = crc16(body);
  return frame[frame.length - 2] === (crc & 0xff) && frame[frame.length - 1] === crc >>> 8;
}
