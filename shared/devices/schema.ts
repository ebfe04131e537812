import { z } from 'zod';
import type { DeviceProblem } from './problems';

/** Serial line settings of one instrument. */
export const serialSettingsSchema = z.object({
  baudRate: z.number().int().positive().max(921600).default(9600),
  dataBits: z.union([z.literal(7), z.literal(8)]).default(8),
  parity: z.enum(['none', 'even', 'odd']).default('none'),
  stopBits: z.union([z.literal(1), z.literal(2)]).default(1),
});
export type SerialSettings = z.infer<typeof serialSettingsSchema>;

/**
 * A digital displacement indicator that answers (polled) or streams (free-running) one ASCII line
 * per reading. `pattern` is a regular expression source with a named group `value`.
 */
export const asciiProfileSchema = z.object({
  protocol: z.literal('ascii'),
  id: z.string().min(1).max(60),
  name: z.string().min(1).max(120),
  serial: serialSettingsSchema,
  mode: z.enum(['polled', 'streaming']),
  /** Request written for each poll; escapes already decoded (e.g. "?\r"). Ignored when streaming. */
  request: z.string().max(32).default(''),
  terminator: z.enum(['\r\n', '\r', '\n']),
  pattern: z.string().min(1).max(300),
  /** Unit the device prints; readings are converted to mm. */
  unit: z.enum(['mm', 'in', 'um', 'counts']),
  /** Multiplier applied after unit conversion (e.g. counts → mm). */
  scale: z.number().positive().default(1),
  /** +1 or −1: the sign convention of the device's output. */
  sign: z.union([z.literal(1), z.literal(-1)]).default(1),
  pollIntervalMs: z.number().int().min(20).max(60000).default(200),
  timeoutMs: z.number().int().min(10).max(10000).default(500),
});
export type AsciiProfile = z.infer<typeof asciiProfileSchema>;

/** A pressure transducer or ADC front-end read over Modbus RTU (function 03 or 04). */
export const modbusProfileSchema = z.object({
  protocol: z.literal('modbus-rtu'),
  id: z.string().min(1).max(60),
  name: z.string().min(1).max(120),
  serial: serialSettingsSchema,
  unitId: z.number().int().min(1).max(247),
  functionCode: z.union([z.literal(3), z.literal(4)]),
  register: z.number().int().min(0).max(65535),
  format: z.enum(['int16', 'uint16', 'int32', 'uint32', 'float32']),
  /**
   * For 32-bit values: which 16-bit register comes first. High word first ("big-endian" word order) is
   * the common convention and the default; some devices send the low word first.
   */
  wordOrder: z.enum(['high-first', 'low-first']).default('high-first'),
  /** Bytes within each register: 'big' as the Modbus specification sends them (high byte first), or 'swapped'. */
  byteOrder: z.enum(['big', 'swapped']).default('big'),
  /** value = raw × scale + offset, in `unit`. */
  scale: z.number().default(1),
  offset: z.number().default(0),
  unit: z.enum(['kPa', 'MPa', 'bar', 'kN']),
  pollIntervalMs: z.number().int().min(20).max(60000).default(200),
  timeoutMs: z.number().int().min(10).max(10000).default(500),
});
export type ModbusProfile = z.infer<typeof modbusProfileSchema>;

export const deviceProfileSchema = z.discriminatedUnion('protocol', [asciiProfileSchema, modbusProfileSchema]);
export type DeviceProfile = z.infer<typeof deviceProfileSchema>;

/** Ids of lab-defined profiles: lower case, digits and dashes, so they read well in a rig's channel list. */
export const labProfileId = z.string().regex(/^[a-z][a-z0-9-]{1,59}$/, 'lower-case letters, digits and dashes, starting with a letter (2–60)');

/** A device profile the lab defines (POST /api/device-profiles): the same shape as the built-ins. */
export const labProfileInput = z.discriminatedUnion('protocol', [asciiProfileSchema.extend({ id: labProfileId }), modbusProfileSchema.extend({ id: labProfileId })]);
export type LabProfileInput = z.infer<typeof labProfileInput>;

/** PUT /api/device-profiles/:id: the whole profile but its id, which rigs refer to and never changes. */
export const labProfileReplace = z.discriminatedUnion('protocol', [asciiProfileSchema.omit({ id: true }), modbusProfileSchema.omit({ id: true })]);
export type LabProfileReplace = z.infer<typeof labProfileReplace>;

export const profileIdParams = z.object({ id: labProfileId });

/** POST /api/device-profiles/preview: read a port with a profile for a moment, before any rig names it. */
export const profilePreviewInput = z.object({
  profile: deviceProfileSchema,
  /** Serial port path, e.g. /dev/ttyUSB0. */
  port: z.string().trim().min(1).max(200),
  durationMs: z.number().int().min(200).max(5000).default(1500),
});
export type ProfilePreviewInput = z.input<typeof profilePreviewInput>;

/** What the preview saw: each sample in order, with its cause in words when it had no value. */
export interface ProfilePreview {
  port: string;
  /** False when the port never opened during the preview (then `problem` says why). */
  opened: boolean;
  problem: string | null;
  samples: { seq: number; status: SampleStatus; raw: string; value: number | null; problem: string | null }[];
}

/** A profile as the API lists it: where it comes from, and for the lab's own, when it last changed. */
export type ListedDeviceProfile = DeviceProfile & { source: 'built-in' | 'lab'; updatedAt: string | null };

export const SAMPLE_STATUSES = ['ok', 'timeout', 'rejected', 'disconnected'] as const;
export type SampleStatus = (typeof SAMPLE_STATUSES)[number];

/**
 * One reading as the device layer emits it. `seq` rises by one per device and never repeats;
 * `t` is a monotonic clock in ms. `value` is in the profile's engineering unit (mm for gauges)
 * and is absent whenever the frame could not be trusted.
 */
export interface DeviceSample {
  deviceId: string;
  channel: string;
  seq: number;
  /** When it was taken, on the reader clock's monotonic milliseconds (devices/port/clock). */
  t: number;
  raw: string;
  value?: number;
  status: SampleStatus;
  /** Why no value was trusted (every status but 'ok'). */
  problem?: DeviceProblem;
}
