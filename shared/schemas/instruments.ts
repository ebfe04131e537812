import { z } from 'zod';
import { calibratedRange } from '../calibration/evaluate';
import { calibrationSchema } from '../calibration/schema';
import { optionalText, patchOf, requiredText } from './common';

export const INSTRUMENT_KINDS = ['gauge', 'pressure', 'jack', 'load-cell'] as const;
export type InstrumentKind = (typeof INSTRUMENT_KINDS)[number];

export const instrumentInput = z
  .object({
    kind: z.enum(INSTRUMENT_KINDS),
    makeModel: requiredText(120),
    serialNumber: requiredText(80),
    rangeMin: z.number().nullable().default(null),
    rangeMax: z.number().nullable().default(null),
    /** Unit of the range and resolution (mm for gauges, bar/MPa/kPa for pressure, kN for load cells and jacks). */
    unit: requiredText(16),
    resolution: z.number().positive().nullable().default(null),
    /** Stem travel of a displacement gauge, mm. */
    travelMm: z.number().positive().max(500).nullable().default(null),
    /** A jack's rated (maximum working) oil pressure, MPa: no prompt goes beyond it. Required for jacks. */
    ratedPressureMpa: z.number().positive().max(300).nullable().default(null),
    notes: optionalText(2000),
  })
  .refine((i) => i.rangeMin == null || i.rangeMax == null || i.rangeMin < i.rangeMax, { message: 'must be above rangeMin', path: ['rangeMax'] })
  .refine((i) => i.kind !== 'jack' || i.ratedPressureMpa != null, { message: "a jack needs its rated pressure (from its plate or certificate)", path: ['ratedPressureMpa'] });
export type InstrumentInput = z.infer<typeof instrumentInput>;
/** PATCH body: the fields to change; the server checks the whole instrument after merging. */
export const instrumentPatch = patchOf(instrumentInput);

const isoDate = z.iso.date('a date as YYYY-MM-DD');

export const calibrationRecordInput = z
  .object({
    calibratedOn: isoDate,
    dueOn: isoDate,
    /** The fitted curve or table: instrument reading → engineering value. */
    method: calibrationSchema,
    notes: optionalText(2000),
  })
  .refine((c) => c.dueOn > c.calibratedOn, { message: 'must be after calibratedOn', path: ['dueOn'] })
  // Every calibration says where it is valid: nothing is worked out from it beyond that span.
  .refine((c) => Number.isFinite(calibratedRange(c.method)[1]), { message: 'give the span the certificate covers (from, to)', path: ['method', 'range'] });
export type CalibrationRecordInput = z.infer<typeof calibrationRecordInput>;

export const CALIBRATION_STATUSES = ['in-calibration', 'due-soon', 'overdue', 'uncalibrated'] as const;
export type CalibrationStatus = (typeof CALIBRATION_STATUSES)[number];

export interface CalibrationRecord extends CalibrationRecordInput {
  id: number;
  instrumentId: number;
  certificateFile: string | null;
  createdBy: number | null;
  createdAt: string;
}

export interface Instrument extends InstrumentInput {
  id: number;
  status: CalibrationStatus;
  /** The calibration in force: the one with the latest calibration date. */
  current: CalibrationRecord | null;
  createdAt: string;
  updatedAt: string;
}

export const GAUGE_DIRECTIONS = [1, -1] as const;

/** One channel of a rig: which instrument, on which port, speaking which device profile. */
export const rigChannelInput = z.object({
  key: z.string().regex(/^[a-z][a-z0-9-]{0,15}$/, 'lower-case letters, digits and dashes, starting with a letter'),
  role: z.enum(['gauge', 'pressure', 'load']),
  label: requiredText(60),
  instrumentId: z.number().int().positive().nullable().default(null),
  profileId: requiredText(60),
  /** Serial port path, e.g. /dev/ttyUSB0; empty for a manual (typed-in) channel. */
  port: z.string().trim().max(200).default(''),
  /** Gauges only: position on the plate (mm from its centre), stem direction, travel. */
  gauge: z
    .object({
      xMm: z.number().min(-2000).max(2000),
      yMm: z.number().min(-2000).max(2000),
      /** +1 when the reading rises as the plate settles (stem retracting), −1 when it falls. */
      direction: z.union([z.literal(1), z.literal(-1)]),
      travelMm: z.number().positive().max(500),
    })
    .nullable()
    .default(null),
});
export type RigChannelInput = z.infer<typeof rigChannelInput>;

export const rigInput = z
  .object({
    name: requiredText(80),
    /** 'serial': devices on ports; 'manual': dial gauges read by eye and typed in. */
    mode: z.enum(['serial', 'manual']),
    channels: z.array(rigChannelInput).min(1).max(12),
    /** The jack whose calibration turns oil pressure into force. */
    jackInstrumentId: z.number().int().positive().nullable().default(null),
    notes: optionalText(2000),
    /** A simulated rig: its control channel (127.0.0.1 only) and time acceleration; null for real kit. */
    simulator: z
      .object({
        controlUrl: z.string().regex(/^http:\/\/127\.0\.0\.1:\d{2,5}$/, 'must be http://127.0.0.1:<port>'),
        speed: z.number().min(1).max(1000),
      })
      .nullable()
      .default(null),
  })
  .superRefine((rig, ctx) => {
    const seen = new Set<string>();
    rig.channels.forEach((c, i) => {
      if (seen.has(c.key)) ctx.addIssue({ code: 'custom', message: `duplicate channel key "${c.key}"`, path: ['channels', i, 'key'] });
      seen.add(c.key);
      if (c.role === 'gauge' && !c.gauge) ctx.addIssue({ code: 'custom', message: 'a gauge needs its position, direction and travel', path: ['channels', i, 'gauge'] });
      if (rig.mode === 'serial' && !c.port) ctx.addIssue({ code: 'custom', message: 'required for a serial rig', path: ['channels', i, 'port'] });
    });
    if (!rig.channels.some((c) => c.role === 'gauge')) ctx.addIssue({ code: 'custom', message: 'a rig needs at least one gauge', path: ['channels'] });
  });
export type RigInput = z.infer<typeof rigInput>;
/** PATCH body: the fields to change; the server checks the whole rig after merging. */
export const rigPatch = patchOf(rigInput);

export interface Rig extends RigInput {
  id: number;
  createdAt: string;
  updatedAt: string;
}
