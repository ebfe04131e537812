/**
 * The alarms about the instruments themselves, for a whole rig: a calibration overdue or expiring during
 * the run, a reading outside its calibrated range, a gauge that jumped with no reset to explain it. The
 * engine keeps an {@link InstrumentWatch} reading by reading and asks {@link instrumentAlarms} each tick.
 * Also where a gauge's resolution and travel come from: its instrument in the register, not a constant.
 */
import type { Calibration } from '../calibration/schema';
import { convertPressure, isPressureUnit } from '../calibration/units';
import { calibrationExpiresAtMs } from '../instruments/status';
import type { RigChannelInput } from '../schemas/instruments';
import { type Alarm, calibratedRangeAlarm, calibrationAlarm, unexplainedJumpAlarm } from './alarms';
import { type GaugeJump, jumpBetween } from './gauge-reset';

/** What the register says of one instrument of the rig. */
export interface KitInstrument {
  serial: string;
  /** One division, in the instrument's unit (mm for gauges); null when not recorded. */
  resolution: number | null;
  /** Stem travel of a gauge, mm; null when not recorded. */
  travelMm: number | null;
  /** The calibration in force and its due date (YYYY-MM-DD); null when it has none. */
  calibration: Calibration | null;
  dueOn: string | null;
}

/** Instruments of a rig by id. */
export type Kit = ReadonlyMap<number, KitInstrument>;

/** The division hold rules judge a gauge by when its instrument does not say (a 0.01 mm dial, common practice). */
export const DEFAULT_GAUGE_RESOLUTION_MM = 0.01;

const instrumentOf = (channel: RigChannelInput, kit: Kit) => (channel.instrumentId == null ? undefined : kit.get(channel.instrumentId));

/** A gauge's travel: its instrument's, else what the rig set-up says of the channel. */
export function gaugeTravelMm(channel: RigChannelInput, kit: Kit): number | null {
  return instrumentOf(channel, kit)?.travelMm ?? channel.gauge?.travelMm ?? null;
}

/** One gauge's division, mm: its instrument's resolution, else the common 0.01 mm. */
export function gaugeResolutionMm(channel: RigChannelInput, kit: Kit): number {
  const r = instrumentOf(channel, kit)?.resolution;
  return r != null && r > 0 ? r : DEFAULT_GAUGE_RESOLUTION_MM;
}

/** The division the hold rules judge the mean settlement by: the coarsest of the rig's gauges. */
export function rigResolutionMm(channels: readonly RigChannelInput[], kit: Kit): number {
  const gauges = channels.filter((c) => c.role === 'gauge');
  return gauges.length ? Math.max(...gauges.map((c) => gaugeResolutionMm(c, kit))) : DEFAULT_GAUGE_RESOLUTION_MM;
}

/** What the engine remembers between readings for these alarms. */
export interface InstrumentWatch {
  /** Last reading per channel key: raw (device units, before calibration) and calibrated value, run clock ms. */
  last: Record<string, { tMs: number; raw: number | null; value: number }>;
  /** Jumps per gauge key, oldest first (the latest few). */
  jumps: Record<string, GaugeJump[]>;
  /** When resets were recorded, per gauge key, run clock ms. */
  resets: Record<string, number[]>;
}

export const emptyInstrumentWatch = (): InstrumentWatch => ({ last: {}, jumps: {}, resets: {} });

/** Jumps kept per gauge: the alarm shows the latest; older ones are in the run's alarm events. */
const KEEP_JUMPS = 20;

/** How a gauge reading is judged for a jump. */
export interface JumpJudging {
  /** The gauge's division, mm ({@link gaugeResolutionMm}). */
  resolutionMm: number;
  /**
   * Whether to look for jumps now: under a held load, where settlement only creeps and a jump stands out.
   * While the load changes the plate itself can move that fast.
   */
  held: boolean;
}

/** One good reading (value not null). Under a held load a gauge's reading is compared with its previous one for a jump. */
export function watchReading(
  watch: InstrumentWatch,
  reading: { key: string; role: RigChannelInput['role']; tMs: number; raw: number | null; value: number },
  judging: JumpJudging,
): InstrumentWatch {
  const previous = watch.last[reading.key];
  const last = { ...watch.last, [reading.key]: { tMs: reading.tMs, raw: reading.raw, value: reading.value } };
  const judged = reading.role === 'gauge' && judging.held && previous;
  const jump = judged ? jumpBetween({ tMs: previous.tMs, mm: previous.value }, { tMs: reading.tMs, mm: reading.value }, { resolutionMm: judging.resolutionMm }) : null;
  if (!jump) return { ...watch, last };
  return { ...watch, last, jumps: { ...watch.jumps, [reading.key]: [...(watch.jumps[reading.key] ?? []), jump].slice(-KEEP_JUMPS) } };
}

/** A gauge reset recorded by the crew (run clock ms). */
export function watchReset(watch: InstrumentWatch, key: string, atMs: number): InstrumentWatch {
  return { ...watch, resets: { ...watch.resets, [key]: [...(watch.resets[key] ?? []), atMs] } };
}

/** Inputs of {@link instrumentAlarms}. */
export interface InstrumentAlarmInput {
  channels: readonly RigChannelInput[];
  kit: Kit;
  /** The calibration in force per instrument id where the run applies its own (its set-up, or one applied mid-run); else the kit's. */
  calibrations?: ReadonlyMap<number, Calibration>;
  /** The jack and its calibration (oil pressure → force); null for a rig without one. */
  jack: { instrumentId: number; calibration: Calibration | null } | null;
  /** Oil pressure now and its unit (the pressure channel's calibrated value); null when there is none. */
  oil: { value: number; unit: string | null } | null;
  watch: InstrumentWatch;
  /** Jumps count from here (the current stage's start), run clock ms; null: all. */
  sinceMs: number | null;
  /** Wall clock now, ms: calibrations expire by the calendar. */
  nowWallMs: number;
}

/**
 * Every instrument alarm of the rig now: calibration overdue per instrument (once per instrument, the
 * jack too), reading outside the calibrated range per channel (raw reading against the channel's
 * calibration) and for the jack (oil pressure against the jack calibration), unexplained jump per gauge.
 */
export function instrumentAlarms(input: InstrumentAlarmInput): Alarm[] {
  const alarms: Alarm[] = [];
  const ids = [...new Set([...input.channels.map((c) => c.instrumentId), input.jack?.instrumentId].filter((id): id is number => id != null))];
  for (const id of ids) {
    const i = input.kit.get(id);
    if (!i) continue;
    alarms.push(calibrationAlarm({ instrument: i.serial, dueAtMs: i.dueOn ? calibrationExpiresAtMs(i.dueOn) : null, nowMs: input.nowWallMs }));
  }
  for (const c of input.channels) {
    const i = instrumentOf(c, input.kit);
    const calibration = (c.instrumentId != null ? input.calibrations?.get(c.instrumentId) : undefined) ?? i?.calibration;
    const last = input.watch.last[c.key];
    if (i && calibration && last?.raw != null) {
      const a = calibratedRangeAlarm({ subject: c.key, label: `${c.label} (${i.serial})`, reading: last.raw, calibration });
      if (a) alarms.push(a);
    }
    if (c.role === 'gauge') {
      const jumps = (input.watch.jumps[c.key] ?? []).filter((j) => input.sinceMs === null || j.toMs >= input.sinceMs);
      alarms.push(unexplainedJumpAlarm({ gauge: c.key, jumps, resetsAtMs: input.watch.resets[c.key] ?? [] }));
    }
  }
  const jackCalibration = input.jack?.calibration;
  if (jackCalibration && input.oil) {
    const { value, unit } = input.oil;
    const to = jackCalibration.inputUnit;
    const oil = unit === to || !unit ? value : isPressureUnit(unit) && isPressureUnit(to) ? convertPressure(value, unit, to) : null;
    const serial = input.kit.get(input.jack!.instrumentId)?.serial ?? 'the jack';
    const a = oil === null ? null : calibratedRangeAlarm({ subject: 'jack', label: `Oil pressure on jack ${serial}`, reading: oil, calibration: jackCalibration });
    if (a) alarms.push(a);
  }
  return alarms;
}
