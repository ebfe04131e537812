import { type Plate, plateAreaM2, plateForceKn } from '../domain/plate';
import { InterpretationInputError, requireNonNegative, requirePositive } from '../interpretation/input-checks';
import type { Branch } from '../plans/stages';

/** Inputs of {@link nextStepPrompt}. */
export interface NextStepInput {
  /** The next planned stage. */
  stage: { index: number; branch: Branch; targetKpa: number };
  plate: Plate;
  /** Weight of column, spacers and jack body resting on the plate, kN; the jack supplies the rest. Default 0. */
  apparatusWeightKn?: number;
  /** The jack's calibration, inverted: gauge pressure that gives this jack force; null outside the calibrated range. */
  forceToGaugePressure: (jackForceKn: number) => number | null;
  /** Unit of the gauge pressure the calibration returns, e.g. 'MPa' or 'bar'. */
  gaugeUnit: string;
}

/** What to apply next, in the operator's terms. */
export interface NextStepPrompt {
  stageIndex: number;
  branch: Branch;
  targetKpa: number;
  /** Total force on the plate at the target, kN (q·A). */
  plateForceKn: number;
  /** Force the jack must supply, kN (total force minus the apparatus weight; 0 when the apparatus alone is heavier). */
  jackForceKn: number;
  /** Gauge pressure to pump to; null when the calibration cannot give it (see `problem`). */
  gaugePressure: number | null;
  gaugeUnit: string;
  /** Why the prompt cannot be followed as it stands; null when it can. */
  problem: string | null;
}

/**
 * The prompt once a hold is satisfied: the next target, the plate force it means and the jack gauge
 * pressure to pump to. q = (F_jack + W_app)/A ⇒ F_jack = q·A − W_app (DOMAIN §B.1, §D.1); the
 * gauge pressure comes from the jack's own calibration, passed in.
 */
export function nextStepPrompt(input: NextStepInput): NextStepPrompt {
  const targetKpa = requireNonNegative(input.stage.targetKpa, 'stage.targetKpa');
  requirePositive(input.plate.sizeMm, 'plate.sizeMm');
  const apparatusKn = requireNonNegative(input.apparatusWeightKn ?? 0, 'apparatusWeightKn');
  const totalKn = plateForceKn(input.plate, targetKpa);
  const base = { stageIndex: input.stage.index, branch: input.stage.branch, targetKpa, plateForceKn: totalKn, gaugeUnit: input.gaugeUnit };

  // The jack cannot pull: when the apparatus alone reaches the target, the prompt is to release fully (gauge at 0).
  if (totalKn <= apparatusKn) {
    const apparatusKpa = apparatusKn / plateAreaM2(input.plate);
    const rest = apparatusKn === 0 ? '' : ` The apparatus alone presses ${apparatusKpa.toFixed(1)} kPa on the plate.`;
    const problem = totalKn === apparatusKn ? null : `Release the jack fully: the target ${targetKpa} kPa is below the apparatus weight.${rest}`;
    return { ...base, jackForceKn: 0, gaugePressure: 0, problem };
  }

  const jackForceKn = totalKn - apparatusKn;
  const pressure = input.forceToGaugePressure(jackForceKn);
  if (pressure !== null && !Number.isFinite(pressure)) {
    throw new InterpretationInputError('forceToGaugePressure', `returned ${pressure} for ${jackForceKn.toFixed(3)} kN`);
  }
  const gaugePressure = pressure !== null && pressure >= 0 ? pressure : null;
  const problem = gaugePressure === null ? `A jack force of ${jackForceKn.toFixed(2)} kN is outside the jack's calibrated range.` : null;
  return { ...base, jackForceKn, gaugePressure, problem };
}
