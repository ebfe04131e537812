/**
 * What the rig's latest calibrated readings mean for the test: each gauge's settlement (zero,
 * direction and reset offsets applied), their mean and tilt, and the mean pressure under the plate
 * from the jack's oil pressure through its calibration plus the apparatus weight (reference §B.1).
 */
import { type Branch, applyCalibration, outsideCalibratedSpan } from '../calibration/evaluate';
import { inverseCalibration, OutsideCalibratedRange } from '../calibration/inverse';
import type { Calibration } from '../calibration/schema';
import { convertPressure, isPressureUnit } from '../calibration/units';
import { type Plate, plateAreaM2 } from '../domain/plate';
import { type PlateTiltState, plateTiltState } from '../hold/alarms';
import { gaugeSettlement } from '../hold/gauge-reset';
import type { RigChannelInput } from '../schemas/instruments';

export interface GaugeNow {
  key: string;
  readingMm: number | null;
  settlementMm: number | null;
}

export interface Measurements {
  gauges: GaugeNow[];
  meanSettlementMm: number | null;
  tilt: PlateTiltState | null;
  /** Oil pressure on the jack, in `oilUnit`. */
  oilPressure: number | null;
  oilUnit: string | null;
  jackForceKn: number | null;
  plateForceKn: number | null;
  pressureKpa: number | null;
  /** Why pressure cannot be worked out, when it cannot. */
  pressureProblem: string | null;
}

export interface MeasurementSetup {
  channels: readonly RigChannelInput[];
  plate: Plate;
  apparatusWeightKn: number;
  /** Jack calibration: oil pressure (its input unit) → jack force, kN. */
  jack: Calibration | null;
  /** Unit of the pressure channel's calibrated value. */
  pressureUnit: string | null;
}

/**
 * `branch`: which side of the jack's calibration applies — 'falling' while unloading, when seal
 * friction makes the same oil pressure give a different force (reference §D.1).
 */
export function measure(setup: MeasurementSetup, latest: ReadonlyMap<string, number | null>, zeros: Record<string, number>, offsets: Record<string, number>, branch: Branch = 'rising'): Measurements {
  const gauges: GaugeNow[] = [];
  const placed: { xMm: number; yMm: number; settlementMm: number }[] = [];
  for (const c of setup.channels) {
    if (c.role !== 'gauge' || !c.gauge) continue;
    const readingMm = latest.get(c.key) ?? null;
    const zero = zeros[c.key];
    const settlementMm = readingMm === null || zero === undefined ? null : gaugeSettlement(readingMm, zero, c.gauge.direction, [offsets[c.key] ?? 0]);
    gauges.push({ key: c.key, readingMm, settlementMm });
    if (settlementMm !== null) placed.push({ xMm: c.gauge.xMm, yMm: c.gauge.yMm, settlementMm });
  }
  const meanSettlementMm = placed.length ? placed.reduce((a, g) => a + g.settlementMm, 0) / placed.length : null;
  const tilt = placed.length >= 2 ? plateTiltState(placed) : null;

  const pressureChannel = setup.channels.find((c) => c.role === 'pressure');
  const loadChannel = setup.channels.find((c) => c.role === 'load');
  const oilPressure = pressureChannel ? (latest.get(pressureChannel.key) ?? null) : null;
  let jackForceKn: number | null = null;
  let pressureProblem: string | null = null;
  if (loadChannel) {
    jackForceKn = latest.get(loadChannel.key) ?? null;
  } else if (oilPressure !== null) {
    const oil = oilToJackUnit(setup, oilPressure);
    if (typeof oil === 'string') pressureProblem = oil;
    else {
      jackForceKn = Math.max(0, applyCalibration(setup.jack!, oil, branch));
      // Beyond the jack's certificate the force is the curve extended: shown, never silently.
      const outside = outsideCalibratedSpan(setup.jack!, oil);
      if (outside) pressureProblem = `Oil pressure ${Number(oil.toPrecision(4))} ${setup.jack!.inputUnit} is ${outside.side} the jack calibration (${outside.range[0]}–${outside.range[1]} ${setup.jack!.inputUnit}): the plate pressure is extrapolated.`;
    }
  } else if (!pressureChannel) {
    pressureProblem = 'The rig has no pressure or load channel.';
  }
  const plateForceKn = jackForceKn === null ? null : jackForceKn + setup.apparatusWeightKn;
  const pressureKpa = plateForceKn === null ? null : plateForceKn / plateAreaM2(setup.plate);
  return { gauges, meanSettlementMm, tilt, oilPressure, oilUnit: setup.pressureUnit, jackForceKn, plateForceKn, pressureKpa, pressureProblem };
}

/** Oil pressure in the jack calibration's input unit, or why it cannot be had. */
function oilToJackUnit(setup: MeasurementSetup, oil: number): number | string {
  if (!setup.jack) return 'The rig has no calibrated jack: choose one in the rig set-up.';
  const from = setup.pressureUnit;
  const to = setup.jack.inputUnit;
  if (from === to) return oil;
  if (!from || !isPressureUnit(from) || !isPressureUnit(to)) return `Pressure channel unit ${from} does not match the jack calibration's ${to}.`;
  return convertPressure(oil, from, to);
}

/**
 * The jack's gauge pressure (its calibration input unit) for a jack force; null where it cannot say.
 * Beyond the calibrated range it is the curve extended (a typed pressure is kept, not dropped; the
 * outside-calibration alarm flags it). Prompts go through `jackGaugeFor`, which refuses instead.
 */
export function jackGaugePressure(jack: Calibration | null, branch: Branch = 'rising'): (jackForceKn: number) => number | null {
  if (!jack) return () => null;
  const inverse = inverseCalibration(jack, branch);
  return (force) => {
    try {
      const p = inverse(force);
      return Number.isFinite(p) ? p : null;
    } catch (err) {
      return err instanceof OutsideCalibratedRange ? err.needed : null;
    }
  };
}
