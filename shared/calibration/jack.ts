import { applyCalibration, type Branch, calibratedRange } from './evaluate';
import { inverseCalibration, OutsideCalibratedRange } from './inverse';
import type { Calibration } from './schema';
import { convertPressure, isPressureUnit, type PressureUnit } from './units';

/*
 * Jack force from oil pressure (reference §B.1, §D.1): ideally F = p·A_ram; in practice through the
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
 * apparatus weight. Throws for a force the apparatus alone exceeds, or one outside the calibrated range
 * ({@link OutsideCalibratedRange}).
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

/** Why a jack must not be pumped to the pressure a force needs. */
export interface JackRefusal {
  /**
   * 'above-calibration' / 'below-calibration': the pressure lies outside the jack calibration's span;
   * 'rated': above the jack's rated pressure; 'unusable': there is no calibration to work it out with.
   */
  reason: 'above-calibration' | 'below-calibration' | 'rated' | 'unusable';
  /** Gauge pressure the force would need (the curve extended), in the gauge unit; null when it cannot be said. */
  needed: number | null;
  /** The limit broken, in the gauge unit; null when `unusable`. */
  limit: number | null;
  /** What is wrong, for `unusable`. */
  detail: string | null;
}

/** The gauge pressure for a jack force, or why there is none to pump to. */
export type GaugeAnswer = { pressure: number; refusal: null } | { pressure: null; refusal: JackRefusal };

/** Options of {@link jackGaugeFor}. */
export interface JackGaugeOptions {
  /** Calibration branch: 'rising' when loading (the default), 'falling' when unloading. */
  branch?: Branch;
  /** Unit the operator reads the pressure in (the pressure channel's). Defaults to the calibration's input unit. */
  unit?: string | null;
  /** The jack's rated (maximum working) pressure, MPa; null or omitted when not recorded. */
  ratedPressureMpa?: number | null;
}

const refuse = (refusal: JackRefusal): GaugeAnswer => ({ pressure: null, refusal });

/**
 * What the operator pumps to for a jack force: the gauge pressure from the jack calibration (inverted,
 * never beyond its calibrated span), in the unit the operator reads, refused above the jack's rated
 * pressure. Each refusal carries the pressure that would have been needed and the limit it breaks.
 */
export function jackGaugeFor(calibration: Calibration | null, options: JackGaugeOptions = {}): { unit: string; pressureFor: (jackForceKn: number) => GaugeAnswer } {
  if (!calibration) return { unit: options.unit ?? '—', pressureFor: () => refuse({ reason: 'unusable', needed: null, limit: null, detail: 'The rig has no calibrated jack: choose one in the rig set-up.' }) };
  let calibratedUnit: PressureUnit;
  try {
    calibratedUnit = checkJackCalibration(calibration);
  } catch (err) {
    const detail = (err as Error).message;
    return { unit: options.unit ?? calibration.inputUnit, pressureFor: () => refuse({ reason: 'unusable', needed: null, limit: null, detail }) };
  }
  const shown = options.unit && isPressureUnit(options.unit) ? options.unit : calibratedUnit;
  const toShown = (p: number) => convertPressure(p, calibratedUnit, shown);
  const rated = options.ratedPressureMpa != null && options.ratedPressureMpa > 0 ? convertPressure(options.ratedPressureMpa, 'MPa', shown) : null;
  const [lo, hi] = calibratedRange(calibration);
  const branch = options.branch ?? 'rising';
  const inverse = inverseCalibration(calibration, branch);
  // Whether a force beyond the span lies at its low end (for curves that cannot say what they would need).
  const belowSpan = (force: number) => {
    const [fLo, fHi] = [applyCalibration(calibration, lo, branch), applyCalibration(calibration, hi, branch)];
    return fLo < fHi ? force < fLo : force > fLo;
  };
  return {
    unit: shown,
    pressureFor: (jackForceKn) => {
      let pressure: number;
      try {
        pressure = toShown(inverse(jackForceKn));
      } catch (err) {
        if (!(err instanceof OutsideCalibratedRange)) throw err;
        const needed = err.needed === null ? null : toShown(err.needed);
        const below = err.needed !== null ? err.needed < lo : belowSpan(jackForceKn);
        // The smaller of two broken upper limits is the one that matters.
        if (!below && rated !== null && rated < toShown(hi)) return refuse({ reason: 'rated', needed, limit: rated, detail: null });
        return refuse({ reason: below ? 'below-calibration' : 'above-calibration', needed, limit: toShown(below ? lo : hi), detail: null });
      }
      if (rated !== null && pressure > rated) return refuse({ reason: 'rated', needed: pressure, limit: rated, detail: null });
      return { pressure, refusal: null };
    },
  };
}
