import { type AsciiProfile, asciiProfileSchema, type DeviceProfile, type ModbusProfile, modbusProfileSchema } from './schema';

/*
 * Built-in device profiles. They describe generic protocol shapes of our own making, not any
 * particular product; the lab adds its own models through the same schema (the device profile
 * editor, stored in the database). Parsing here checks them once at start-up and fills the
 * schema defaults.
 */

/** Polled digital indicator: "?\r" → "+012.345 mm\r\n", 0.001 mm resolution. */
export const polledMmIndicator: AsciiProfile = asciiProfileSchema.parse({
  protocol: 'ascii',
  id: 'ascii-polled-mm',
  name: 'Polled indicator, mm, 0.001 mm',
  serial: { baudRate: 9600, dataBits: 8, parity: 'none', stopBits: 1 },
  mode: 'polled',
  request: '?\r',
  terminator: '\r\n',
  pattern: String.raw`(?<value>[+-]\d{3}\.\d{3}) mm`,
  unit: 'mm',
  pollIntervalMs: 200,
  timeoutMs: 300,
});

/** Free-running indicator printing inches to 0.0001 in, 7 data bits, even parity: "+0.4858in\r". */
export const streamingInchIndicator: AsciiProfile = asciiProfileSchema.parse({
  protocol: 'ascii',
  id: 'ascii-stream-inch',
  name: 'Free-running indicator, inch, 0.0001 in',
  serial: { baudRate: 4800, dataBits: 7, parity: 'even', stopBits: 1 },
  mode: 'streaming',
  terminator: '\r',
  pattern: String.raw`(?<value>[+-]\d\.\d{4})in`,
  unit: 'in',
  timeoutMs: 1000,
});

/**
 * Free-running displacement module printing raw counts behind a status letter: "A,+0024690\n".
 * Only status A (valid) is a reading; 0.5 µm per count; counts fall as the stem is pushed in.
 */
export const statusCountsIndicator: AsciiProfile = asciiProfileSchema.parse({
  protocol: 'ascii',
  id: 'ascii-stream-counts',
  name: 'Free-running displacement module, counts with status',
  serial: { baudRate: 19200, dataBits: 8, parity: 'none', stopBits: 1 },
  mode: 'streaming',
  terminator: '\n',
  pattern: String.raw`A,(?<value>[+-]\d{7})`,
  unit: 'counts',
  scale: 0.0005,
  sign: -1,
  timeoutMs: 1000,
});

/** Oil-pressure transducer: one signed 16-bit holding register 0 in 0.1 bar steps (±3276.7 bar). */
export const holdingInt16Transducer: ModbusProfile = modbusProfileSchema.parse({
  protocol: 'modbus-rtu',
  id: 'modbus-hr0-int16',
  name: 'Pressure transducer, holding register 0, int16 × 0.1 bar',
  serial: { baudRate: 19200, dataBits: 8, parity: 'even', stopBits: 1 },
  unitId: 1,
  functionCode: 3,
  register: 0,
  format: 'int16',
  scale: 0.1,
  unit: 'bar',
  pollIntervalMs: 200,
  timeoutMs: 300,
});

/**
 * Pressure transducer: IEEE-754 float32 in MPa on input registers 2–3, high word first ("big-endian"
 * word order, the common convention for 32-bit Modbus values).
 */
export const inputFloat32HighFirstTransducer: ModbusProfile = modbusProfileSchema.parse({
  protocol: 'modbus-rtu',
  id: 'modbus-ir2-float32-hw',
  name: 'Pressure transducer, input registers 2–3, float32 MPa (high word first)',
  serial: { baudRate: 9600, dataBits: 8, parity: 'none', stopBits: 2 },
  unitId: 2,
  functionCode: 4,
  register: 2,
  format: 'float32',
  wordOrder: 'high-first',
  byteOrder: 'big',
  unit: 'MPa',
  pollIntervalMs: 250,
  timeoutMs: 400,
});

/**
 * ADC front-end: IEEE-754 float32 in MPa on input registers 2–3, low word first. Kept under its id
 * for the rigs that use it; a device sending the high word first needs the profile above, or it
 * reads nonsense (12.5 MPa as about 2e-41).
 */
export const inputFloat32Transducer: ModbusProfile = modbusProfileSchema.parse({
  ...inputFloat32HighFirstTransducer,
  id: 'modbus-ir2-float32',
  name: 'Pressure ADC, input registers 2–3, float32 MPa (low word first)',
  wordOrder: 'low-first',
});

export const DEFAULT_DEVICE_PROFILES: readonly DeviceProfile[] = [
  polledMmIndicator,
  streamingInchIndicator,
  statusCountsIndicator,
  holdingInt16Transducer,
  inputFloat32HighFirstTransducer,
  inputFloat32Transducer,
];
