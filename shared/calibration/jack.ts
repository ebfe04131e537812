import { applyCalibration, type Branch } from './evaluate';
import { inverseCalibration } from './inverse';
import type { Calibration } from './schema';
import { convertPressure, isPressureUnit, type PressureUnit } from './units';

/*
 * Jack force from oil pressure (DOMAIN §B.1, §D.1): ideally F = p·A_ram; in practice through the
 * calibration of jack and gauge together, and the apparatus resting on the plate adds its weight:
 * plate force = jack force + apparatus weight.
 */

/** kN per (MPa·cm²): 1 N/mm² × 100 mm² = 100 N. */
const KN_PER_MPA_CM2 = 0.1;

/** Force in kN of an ideal (frictionless) ram of `ramAreaCm2` at a gauge pressure. */
export function idealJackForceKn(pressure: number, unit: PressureUnit, ramAreaCm2: number): number {
  return convertPressure(pressure, unit, 'MPa') * ramAreaCm2 * KN_PER_MPA_CM2;
}

/** Gauge pressure (in `unit`) an ideal ram of `ramAreaCm2` needs for a jack force in kN. */
export function idealJackPressure(jackForceKn: number, ramAreaCm2: number, unit: PressureUnit): number {
  if (!(ramAreaCm2 > 0)) throw new RangeError('"ramAreaCm2" must be positive');
  return convertPressure(jackForceKn / (ramAreaCm2 * KN_PER_MPA_CM2), 'MPa', unit);
}

/** The ideal ram as a calibration (pressure in `unit` → kN), for a jack with no certificate yet. */
export function idealJackCalibration(ramAreaCm2: number, unit: PressureUnit = 'MPa'): Calibration {
  if (!(ramAreaCm2 > 0)) throw new RangeError('"ramAreaCm2" must be positive');
  return { inputUnit: unit, outputUnit: 'kN', curve: { kind: 'linear', c0: 0, c1: idealJackForceKn(1, unit, ramAreaCm2) } };
}

function checkJackCalibration(calibration: Calibration): PressureUnit {
  const { inputUnit, outputUnit } = calibration;
  if (!isPressureUnit(inputUnit)) throw new TypeError(`"inputUnit" of a jack calibration must be a pressure unit, not ${inputUnit}`);
  if (outputUnit !== 'kN') throw new TypeError(`"outputUnit" of a jack calibration must be kN, not ${outputUnit}`);
  return inputUnit;
}

/** Options of the jack conversions. */
export interface JackOptions {
  /** Weight of loading column, spacers, upper plates and jack resting on the plate, kN. Defaults to 0. */
  apparatusWeightKn?: number;
  /** Calibration branch: 'rising' when loading (the default), 'falling' when unloading. */
  branch?: Branch;
}

/** Total force on the plate, kN, at a gauge pressure given in the calibration's input unit. */
export function plateForceFromGaugeKn(calibration: Calibration, gaugePressure: number, options: JackOptions = {}): number {
  checkJackCalibration(calibration);
  return applyCalibration(calibration, gaugePressure, options.branch) + (options.apparatusWeightKn ?? 0);
}

/** Options of {@link createForceToGaugePressure}. */
export interface ForceToGaugeOptions extends JackOptions {
  /** Unit of the returned gauge pressure. Defaults to the calibration's input unit. */
  unit?: PressureUnit;
}

/**
 * Builds `forceToGaugePressure(plateForceKn)`: the gauge pressure to pump to for a total plate
 * force, through the jack calibration (its rising branch unless told otherwise), less the
 * apparatus weight. Throws for a force the apparatus alone exceeds, or beyond a polynomial's range.
 */
export function createForceToGaugePressure(calibration: Calibration, options: ForceToGaugeOptions = {}): (plateForceKn: number) => number {
  const calibratedUnit = checkJackCalibration(calibration);
  const { apparatusWeightKn = 0, branch = 'rising', unit = calibratedUnit } = options;
  if (!(apparatusWeightKn >= 0)) throw new RangeError('"apparatusWeightKn" must be zero or positive');
  const inverse = inverseCalibration(calibration, branch);
  return (plateForceKn) => {
    const jackForceKn = plateForceKn - apparatusWeightKn;
    if (!(jackForceKn >= 0)) throw new RangeError(`plate force ${plateForceKn} kN is below the apparatus weight ${apparatusWeightKn} kN`);
    return convertPressure(inverse(jackForceKn), calibratedUnit, unit);
  };
}
