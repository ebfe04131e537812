import { calibratedRange, outsideCalibratedSpan } from '../calibration/evaluate';
import type { Calibration } from '../calibration/schema';
import { InterpretationInputError, requireFinite, requireInRange, requireNonNegative, requirePositive } from '../interpretation/input-checks';
import { type GaugeAtPosition, meanSettlement, planeFitTilt, type Tilt, tiltBetweenGauges } from '../interpretation/reduction';
import type { Termination } from '../schemas/plans';
import { formatPlanned, formatQuantity } from '../units/format';
import type { GaugeJump } from './gauge-reset';
import type { RuleSource } from './verdict';

export type AlarmCode =
  | 'load-drift'
  | 'plate-tilt'
  | 'gauge-travel'
  | 'stop-limit'
  | 'reaction-capacity'
  | 'signal-lost'
  | 'calibration-overdue'
  | 'outside-calibration'
  | 'unexplained-jump'
  | 'readings-unsecured';
export type AlarmSeverity = 'warning' | 'critical';

/** The state of one alarm rule now. Rules are pure; the lifecycle (acknowledge, shelve…) is alarm-lifecycle.ts. */
export interface Alarm {
  code: AlarmCode;
  /** What the alarm is about when a rule applies per item (a gauge, a channel, an instrument); null otherwise. */
  subject: string | null;
  severity: AlarmSeverity;
  active: boolean;
  message: string;
  /** The figure the rule judged, in `unit`; null when there is none (e.g. no sample yet). */
  value: number | null;
  limit: number;
  unit: string;
  source: RuleSource;
  /** What the rule saw, where a figure is not enough (e.g. the readings either side of a jump). */
  evidence?: AlarmEvidence;
  /**
   * Inactive, but not yet back inside the narrower band a raised alarm must return to before it clears
   * (the deadband): the alarm board keeps a raised alarm standing while this holds, so a figure hovering
   * at its limit does not raise and clear over and over.
   */
  inDeadband?: boolean;
}

/** Two readings and their times (run clock ms) that show what the alarm is about. */
export interface AlarmEvidence {
  before: { atMs: number; value: number };
  after: { atMs: number; value: number };
  unit: string;
}

const pct = (fraction: number) => formatQuantity(fraction * 100, '%');

/** Share of a limit a raised tilt, travel or capacity alarm must come back under before it clears. */
const CLEAR_SHARE = 0.8;

/** Options of {@link loadDriftAlarm}. */
export interface LoadDriftInput {
  targetKpa: number;
  actualKpa: number;
  /** Tolerance as a percentage of the target, %. Default 2. */
  tolerancePercent?: number;
  /** Smallest tolerance, kPa (one gauge division, roughly); the larger of the two applies. Default 2. */
  toleranceKpa?: number;
  /**
   * The pressure the apparatus puts on the plate by its own weight, kPa. With the jack released the plate
   * still carries it, so a target at or below it is no load the jack holds: there is no drift to watch
   * (and never a "let some pressure off" with the valve open). Default 0.
   */
  deadWeightKpa?: number;
  /** Share of the tolerance a raised alarm must come back inside before it clears. Default 0.5. */
  clearFraction?: number;
}

/**
 * Load drifting from its target during a hold beyond ±max(2 % of target, fixed kPa) (reference §D.1, common
 * practice), with a top-up prompt. Once raised it clears only back within half that band (`inDeadband`).
 */
export function loadDriftAlarm(input: LoadDriftInput): Alarm {
  const planned = requireNonNegative(input.targetKpa, 'targetKpa');
  const deadWeight = requireNonNegative(input.deadWeightKpa ?? 0, 'deadWeightKpa');
  const actual = requireFinite(input.actualKpa, 'actualKpa');
  const limit = Math.max(
    (requireNonNegative(input.tolerancePercent ?? 2, 'tolerancePercent') / 100) * planned,
    requireNonNegative(input.toleranceKpa ?? 2, 'toleranceKpa'),
  );
  const source: RuleSource = { tag: 'common practice', text: 'Hold the load within ±2 % of the target or a fixed tolerance, whichever is larger; re-pump when it drifts' };
  const base = { code: 'load-drift', subject: null, severity: 'warning', limit, unit: 'kPa', source } as const;
  if (planned <= deadWeight) {
    return {
      ...base,
      active: false,
      message: `No load drift to watch: the ${formatPlanned(planned, 'kPa')} kPa target is at or below the ${formatQuantity(deadWeight, 'kPa')} the apparatus puts on the plate by its own weight.`,
      value: null,
    };
  }
  const deviation = actual - planned;
  const clearBand = requireInRange(input.clearFraction ?? 0.5, 0, 1, 'clearFraction') * limit;
  const active = Math.abs(deviation) > limit;
  const target = `${formatPlanned(planned, 'kPa')} kPa target`;
  const message = !active
    ? `Pressure within ±${formatQuantity(limit, 'kPa')} of the ${target}.`
    : deviation < 0
      ? `Pressure ${formatQuantity(actual, 'kPa')} is ${formatQuantity(-deviation, 'kPa')} below the ${target}: top up the pump.`
      : `Pressure ${formatQuantity(actual, 'kPa')} is ${formatQuantity(deviation, 'kPa')} above the ${target}: let some pressure off.`;
  return { ...base, active, message, value: deviation, inDeadband: !active && Math.abs(deviation) > clearBand };
}

/** Options of {@link tiltAlarm}. */
export interface TiltInput {
  /** Gauges at their positions (mm, origin at the plate centre) with their settlements (mm); two or more. */
  gauges: readonly GaugeAtPosition[];
  /** The gauge spread counts when above this fraction of the mean settlement… Default 0.2. */
  spreadFraction?: number;
  /** …and above this, mm. Default 0.5. */
  minSpreadMm?: number;
  /** Largest tilt as a slope (1:100 = 0.01). Default 0.01. */
  maxTiltSlope?: number;
}

/** Tilt figures the console shows and the tilt alarm judges. */
export interface PlateTiltState {
  meanSettlementMm: number;
  /** Largest minus smallest gauge settlement, mm (for a pair of opposite gauges, their difference). */
  spreadMm: number;
  tilt: Tilt;
}

/** Mean, spread and tilt of two or more gauges: θ = atan(|s1 − s2|/L) for two, a least-squares plane for more (reference §B.1). */
export function plateTiltState(gauges: readonly GaugeAtPosition[]): PlateTiltState {
  if (gauges.length < 2) throw new InterpretationInputError('gauges', `tilt needs at least two gauges (got ${gauges.length})`);
  const settlements = gauges.map((g) => g.settlementMm);
  const [g1, g2] = gauges;
  return {
    meanSettlementMm: meanSettlement(settlements, 'gauges'),
    spreadMm: Math.max(...settlements) - Math.min(...settlements),
    tilt: gauges.length === 2 ? tiltBetweenGauges(g1.settlementMm, g2.settlementMm, Math.hypot(g1.xMm - g2.xMm, g1.yMm - g2.yMm)) : planeFitTilt(gauges).tilt,
  };
}

/**
 * Plate tilt (reference §D.3, common practice): warns when the spread between gauges exceeds both 20 % of the
 * mean settlement and 0.5 mm, or the tilt exceeds 1:100. `value`/`limit` report whichever test is nearer
 * its limit; the message gives both.
 */
export function tiltAlarm(input: TiltInput): Alarm {
  const { meanSettlementMm, spreadMm, tilt } = plateTiltState(input.gauges);
  const spreadLimit = Math.max(
    requireNonNegative(input.spreadFraction ?? 0.2, 'spreadFraction') * Math.abs(meanSettlementMm),
    requireNonNegative(input.minSpreadMm ?? 0.5, 'minSpreadMm'),
  );
  const slopeLimit = requirePositive(input.maxTiltSlope ?? 0.01, 'maxTiltSlope');
  const slope = Math.tan(tilt.radians);
  const bySpread = spreadMm / spreadLimit >= slope / slopeLimit;
  const active = spreadMm > spreadLimit || slope > slopeLimit;
  const inDeadband = !active && (spreadMm > CLEAR_SHARE * spreadLimit || slope > CLEAR_SHARE * slopeLimit);
  const oneIn = tilt.oneIn === null ? 'level' : `1:${Math.round(tilt.oneIn)}`;
  return {
    code: 'plate-tilt',
    subject: null,
    severity: 'warning',
    active,
    message: `${active ? 'Plate tilting' : 'Plate tilt acceptable'}: gauges differ by ${formatQuantity(spreadMm, 'mm')} (limit ${formatQuantity(spreadLimit, 'mm')}), tilt ${oneIn} (limit 1:${Math.round(1 / slopeLimit)}).${active ? ' Check for eccentric load, a leaning jack, uneven bedding or a sticking gauge.' : ''}`,
    value: bySpread ? spreadMm : tilt.radians,
    limit: bySpread ? spreadLimit : Math.atan(slopeLimit),
    unit: bySpread ? 'mm' : 'rad',
    inDeadband,
    source: {
      tag: 'common practice',
      text: 'Opposite gauges differing by more than about 20 % of the mean settlement (and 0.5 mm), or tilt beyond about 1:100',
    },
  };
}

/** Options of {@link gaugeTravelAlarm}. */
export interface GaugeTravelInput {
  gauge: string;
  /** The gauge's raw reading, mm. */
  readingMm: number;
  /** Full travel of the gauge, mm. */
  travelMm: number;
  /** +1 when the reading grows as the plate settles, −1 when it falls (stem extending). */
  sign: 1 | -1;
  /** Warn when this fraction of the travel is used. Default 0.85. */
  warnFraction?: number;
}

/** Gauge nearing the end of its travel (reference §D.3, common practice: warn at 80–90 %), prompting a reset while the load is held. */
export function gaugeTravelAlarm(input: GaugeTravelInput): Alarm {
  const travel = requirePositive(input.travelMm, 'travelMm');
  const reading = requireFinite(input.readingMm, 'readingMm');
  const warnAt = requireInRange(input.warnFraction ?? 0.85, 0, 1, 'warnFraction');
  const used = input.sign === 1 ? reading / travel : 1 - reading / travel;
  const atEnd = used >= 1;
  // Once raised, it stands until the gauge is back under the warning level less 5 points (a reset).
  const inDeadband = used < warnAt && used >= warnAt - 0.05;
  return {
    code: 'gauge-travel',
    subject: input.gauge,
    severity: atEnd ? 'critical' : 'warning',
    active: used >= warnAt,
    message: atEnd
      ? `Gauge ${input.gauge} is at the end of its travel: its readings are no longer valid. Reset it while the load is held.`
      : `Gauge ${input.gauge} has used ${pct(used)} of its travel${used >= warnAt ? ': reset it while the load is held, one gauge at a time' : ''}.`,
    value: used * 100,
    limit: warnAt * 100,
    unit: '%',
    inDeadband,
    source: { tag: 'common practice', text: 'Warn at about 80–90 % of gauge travel; reset only under a constant load, one gauge at a time' },
  };
}

/** The settlement at which the test stops, mm: the plan's limit, or the fraction of the plate width when that is smaller. */
export function stopLimitMm(termination: Pick<Termination, 'maxSettlementMm' | 'maxSettlementFractionOfWidth'>, plateSizeMm: number): number {
  const byWidth =
    termination.maxSettlementFractionOfWidth > 0
      ? termination.maxSettlementFractionOfWidth * requirePositive(plateSizeMm, 'plateSizeMm')
      : Number.POSITIVE_INFINITY;
  return Math.min(requirePositive(termination.maxSettlementMm, 'termination.maxSettlementMm'), byWidth);
}

/** Mean settlement at the stop limit. */
export function stopLimitAlarm(input: { meanSettlementMm: number; stopLimitMm: number }): Alarm {
  const value = requireFinite(input.meanSettlementMm, 'meanSettlementMm');
  const limit = requirePositive(input.stopLimitMm, 'stopLimitMm');
  const active = value >= limit;
  return {
    code: 'stop-limit',
    subject: null,
    severity: 'critical',
    active,
    message: active
      ? `Settlement ${formatQuantity(value, 'mm')} has reached the ${formatPlanned(limit, 'mm')} mm stop limit: end the loading.`
      : `Settlement ${formatQuantity(value, 'mm')} of the ${formatPlanned(limit, 'mm')} mm stop limit.`,
    value,
    limit,
    unit: 'mm',
    source: { tag: 'common practice', text: "Stop at the plan's settlement limit (25 mm is common practice for bearing tests)" },
  };
}

/** Options of {@link reactionCapacityAlarm}. */
export interface ReactionInput {
  jackForceKn: number;
  capacityKn: number;
  /** Warn at this fraction of the reaction capacity. Default 0.9. */
  warnFraction?: number;
}

/** Jack force approaching the reaction capacity (reference §D.2, common practice: never use more than ≈ 80–90 % of a vehicle's reaction). */
export function reactionCapacityAlarm(input: ReactionInput): Alarm {
  const capacity = requirePositive(input.capacityKn, 'capacityKn');
  const used = requireFinite(input.jackForceKn, 'jackForceKn') / capacity;
  const warnAt = requireInRange(input.warnFraction ?? 0.9, 0, 1, 'warnFraction');
  return {
    inDeadband: used < warnAt && used >= warnAt - 0.05,
    code: 'reaction-capacity',
    subject: null,
    severity: used >= 1 ? 'critical' : 'warning',
    active: used >= warnAt,
    message: `Jack force ${formatQuantity(input.jackForceKn, 'kN')} is ${pct(used)} of the ${formatPlanned(capacity, 'kN')} kN reaction${used >= warnAt ? ': do not load further without more reaction' : ''}.`,
    value: used * 100,
    limit: warnAt * 100,
    unit: '%',
    source: { tag: 'common practice', text: 'Keep the jack force below about 90 % of the reaction: wheels lift and kentledge tips suddenly' },
  };
}

/** Options of {@link signalLostAlarm}. */
export interface SignalInput {
  channel: string;
  /** When the channel's last sample arrived, ms since the epoch; null before the first. */
  lastSampleAtMs: number | null;
  nowMs: number;
  /** Longest silence before the alarm, s. Default 2. */
  maxGapS?: number;
  /** The port itself reported gone (closed, unplugged): alarm at once rather than after the silence. */
  portLost?: boolean;
}

/** Stale data / signal lost: no sample on a channel for longer than `maxGapS` (QUALITY R3: alarm within 2 s). */
export function signalLostAlarm(input: SignalInput): Alarm {
  const limit = requirePositive(input.maxGapS ?? 2, 'maxGapS');
  const gapS = input.lastSampleAtMs === null ? null : (requireFinite(input.nowMs, 'nowMs') - requireFinite(input.lastSampleAtMs, 'lastSampleAtMs')) / 1000;
  const active = gapS === null || gapS > limit || input.portLost === true;
  return {
    code: 'signal-lost',
    subject: input.channel,
    severity: 'critical',
    active,
    message:
      gapS === null
        ? `No sample from ${input.channel} yet.`
        : input.portLost
          ? `The port of ${input.channel} is gone: check the cable and the instrument.`
          : active
          ? `No sample from ${input.channel} for ${formatQuantity(gapS, 's')}: check the cable and the instrument.`
          : `${input.channel} live.`,
    value: gapS,
    limit,
    unit: 's',
    source: { tag: 'common practice', text: 'A live channel reports every second or faster; a silence of more than 2 s means the signal is lost' },
  };
}

/** Options of {@link calibrationAlarm}. */
export interface CalibrationInput {
  instrument: string;
  /** Calibration due date, ms since the epoch; null when the instrument has no calibration on record. */
  dueAtMs: number | null;
  nowMs: number;
}

const MS_PER_DAY = 86_400_000;

/** Instrument used past its calibration due date, or with none on record (ENV 1997-3 §11: calibrate at least every 6 months). */
export function calibrationAlarm(input: CalibrationInput): Alarm {
  const overdueDays = input.dueAtMs === null ? null : (requireFinite(input.nowMs, 'nowMs') - requireFinite(input.dueAtMs, 'dueAtMs')) / MS_PER_DAY;
  const active = overdueDays === null || overdueDays > 0;
  return {
    code: 'calibration-overdue',
    subject: input.instrument,
    severity: 'warning',
    active,
    message:
      overdueDays === null
        ? `${input.instrument} has no calibration on record.`
        : active
          ? `${input.instrument} is ${Math.ceil(overdueDays)} day(s) past its calibration due date.`
          : `${input.instrument} calibrated; due in ${Math.floor(-overdueDays)} day(s).`,
    value: overdueDays,
    limit: 0,
    unit: 'days',
    source: { tag: 'standard', text: 'ENV 1997-3 §11 — manometers, load and displacement transducers calibrated at least every 6 months' },
  };
}

/** Options of {@link calibratedRangeAlarm}. */
export interface CalibratedRangeInput {
  /** What the reading is of (a channel key, or the jack); the alarm's subject. */
  subject: string;
  /** How the crew knows it, e.g. "Pressure p1 on jack JK-50-031". */
  label: string;
  /** The reading in the calibration's input unit. */
  reading: number;
  calibration: Calibration;
  /**
   * Readings this fraction of the span beyond either end still count as inside: an instrument at rest
   * reads a little either side of its zero. Default 0.01 (1 % of the span).
   */
  marginFraction?: number;
}

/**
 * A reading outside the span its calibration covers: whatever is worked out from it (a force, a plate
 * pressure, a settlement) is the curve extended beyond its certificate, not a calibrated value (common practice).
 * Null for a calibration with no finite span (an ideal ram with no certificate).
 */
export function calibratedRangeAlarm(input: CalibratedRangeInput): Alarm | null {
  const [lo, hi] = calibratedRange(input.calibration);
  if (!Number.isFinite(hi - lo)) return null;
  const reading = requireFinite(input.reading, 'reading');
  const unit = input.calibration.inputUnit;
  const outside = outsideCalibratedSpan(input.calibration, reading, requireNonNegative(input.marginFraction ?? 0.01, 'marginFraction'));
  const below = outside?.side === 'below';
  const active = outside !== null;
  const span = `${formatPlanned(lo, unit)}–${formatPlanned(hi, unit)} ${unit}`;
  return {
    code: 'outside-calibration',
    subject: input.subject,
    severity: 'critical',
    active,
    message: active
      ? `${input.label} reads ${formatQuantity(reading, unit)}, ${below ? 'below' : 'beyond'} its calibration (${span}): values worked out from it are extrapolated, not measured. ${below ? 'Check the instrument and its zero' : 'Let pressure off to within the calibration'}, or use an instrument calibrated for this range.`
      : `${input.label} within its calibration (${span}).`,
    value: reading,
    limit: below ? lo : hi,
    unit,
    source: { tag: 'common practice', text: 'A calibration holds over the span its certificate covers; the curve is not extended beyond it' },
  };
}

/** Options of {@link unexplainedJumpAlarm}. */
export interface JumpAlarmInput {
  gauge: string;
  /** Jumps seen on this gauge in the current stage, oldest first (see `jumpBetween`). */
  jumps: readonly GaugeJump[];
  /** When resets of this gauge were recorded, run clock ms. */
  resetsAtMs: readonly number[];
  /** A reset recorded up to this long after a jump explains it (the crew resets, then records), ms. Default 5 min. */
  graceMs?: number;
}

const clockTime = (ms: number) => new Date(ms).toISOString().slice(11, 19);

/**
 * A gauge reading that jumped with no reset recorded to explain it: a gauge knocked, slipped or reset
 * without a record, or a corrupted line (ASCII indicator lines carry no checksum) (common practice). It
 * stays active, with the readings either side as evidence, until a reset recorded within `graceMs`
 * explains the jump or the stage ends.
 */
export function unexplainedJumpAlarm(input: JumpAlarmInput): Alarm {
  const grace = requireNonNegative(input.graceMs ?? 300_000, 'graceMs');
  const unexplained = input.jumps.filter((j) => !input.resetsAtMs.some((t) => t > j.fromMs && t <= j.toMs + grace));
  const last = unexplained.at(-1);
  const jumpMm = last ? last.toMm - last.fromMm : null;
  return {
    code: 'unexplained-jump',
    subject: input.gauge,
    severity: 'warning',
    active: last !== undefined,
    message: last
      ? `Gauge ${input.gauge} jumped from ${formatQuantity(last.fromMm, 'mm')} at ${clockTime(last.fromMs)} to ${formatQuantity(last.toMm, 'mm')} at ${clockTime(last.toMs)} (${jumpMm! > 0 ? '+' : ''}${formatQuantity(jumpMm, 'mm')}) with no reset recorded${unexplained.length > 1 ? ` (${unexplained.length} jumps this stage)` : ''}: if it was reset, record the reset; otherwise check it is seated and its stem free, and mark the reading faulty.`
      : `Gauge ${input.gauge}: no unexplained jump this stage.`,
    value: jumpMm,
    limit: 0,
    unit: 'mm',
    source: { tag: 'common practice', text: 'A dial or indicator that jumps under a held load was knocked, slipped or reset: find out which and record it' },
    ...(last ? { evidence: { before: { atMs: last.fromMs, value: last.fromMm }, after: { atMs: last.toMs, value: last.toMm }, unit: 'mm' } } : {}),
  };
}

/** Options of {@link readingsUnsecuredAlarm}. */
export interface UnsecuredInput {
  /** Why the run's journal refuses readings; null while every reading reaches the disk. */
  failure: { message: string; waiting: number; lost: number } | null;
  /** Most readings kept in memory meanwhile. */
  maxWaiting: number;
}

/**
 * Readings are not being secured: the run's journal (the disk every reading reaches before anything
 * else sees it) refuses them. Readings wait in memory up to a bound; beyond it the oldest are given up.
 */
export function readingsUnsecuredAlarm(input: UnsecuredInput): Alarm {
  const f = input.failure;
  return {
    code: 'readings-unsecured',
    subject: null,
    severity: 'critical',
    active: f !== null,
    message:
      f === null
        ? 'Readings are secured on disk.'
        : `Readings are not being secured: the journal refuses them (${f.message}). ${f.waiting} wait in memory${f.lost > 0 ? `; ${f.lost} oldest given up` : ''}. Free the disk or stop the run.`,
    value: f === null ? 0 : f.waiting,
    limit: input.maxWaiting,
    unit: 'readings',
    source: { tag: 'common practice', text: 'A reading counts as recorded only once it is on disk; a recorder that cannot write must say so at once' },
  };
}
