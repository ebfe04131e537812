import type { GaugeAnswer, JackRefusal } from '../calibration/jack';
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
  /**
   * The gauge pressure that gives a jack force, or why the jack must not be pumped to it (outside the
   * calibration's range, above the jack's rated pressure): `jackGaugeFor(...).pressureFor`.
   */
  gaugePressureFor: (jackForceKn: number) => GaugeAnswer;
  /** Unit of the gauge pressure, e.g. 'MPa' or 'bar'. */
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
  /** Gauge pressure to pump to; null when the calibration cannot give it or the jack must not reach it (see `problem`). */
  gaugePressure: number | null;
  gaugeUnit: string;
  /** Why the prompt cannot be followed as it stands; null when it can. */
  problem: string | null;
  /** Which limit of the jack refuses the prompt, when one does. */
  refusal?: JackRefusal['reason'] | null;
}

/**
 * Whether a prompt must not be applied at all: the target lies beyond the jack calibration's range or the
 * jack's rated pressure. The run then goes to unloading instead of loading further.
 */
export const promptBlocksLoading = (prompt: Pick<NextStepPrompt, 'refusal'> | null | undefined): boolean => prompt?.refusal === 'above-calibration' || prompt?.refusal === 'rated';

/**
 * The prompt once a hold is satisfied: the next target, the plate force it means and the jack gauge
 * pressure to pump to. q = (F_jack + W_app)/A ⇒ F_jack = q·A − W_app (reference §B.1, §D.1); the
 * gauge pressure comes from the jack's own calibration, passed in. A pressure beyond the calibration's
 * range or the jack's rating is never prompted: the prompt says why and what to do instead.
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
  const answer = input.gaugePressureFor(jackForceKn);
  if (answer.refusal) return { ...base, jackForceKn, gaugePressure: null, problem: refusalText(answer.refusal, targetKpa, jackForceKn, input.gaugeUnit), refusal: answer.refusal.reason };
  if (!Number.isFinite(answer.pressure)) {
    throw new InterpretationInputError('gaugePressureFor', `returned ${answer.pressure} for ${jackForceKn.toFixed(3)} kN`);
  }
  return { ...base, jackForceKn, gaugePressure: answer.pressure, problem: null, refusal: null };
}

/** A figure as the operator reads it: four significant digits, no trailing zeros. */
const figure = (x: number) => String(Number(x.toPrecision(4)));

/** Why the prompt stops, and what the crew can do about it. */
function refusalText(r: JackRefusal, targetKpa: number, jackForceKn: number, unit: string): string {
  const needs = r.needed === null ? `a jack force of ${jackForceKn.toFixed(1)} kN` : `${figure(r.needed)} ${unit} on the jack gauge`;
  const limit = r.limit === null ? '' : `${figure(r.limit)} ${unit}`;
  switch (r.reason) {
    case 'above-calibration':
      return `Target ${targetKpa} kPa needs ${needs}; the jack calibration is valid to ${limit}. Go to unloading from here, or use a larger jack.`;
    case 'rated':
      return `Target ${targetKpa} kPa needs ${needs}; the jack is rated to ${limit}. Go to unloading from here, or use a larger jack.`;
    case 'below-calibration':
      return `Target ${targetKpa} kPa needs ${needs}, below the jack calibration's range (from ${limit}). Use a smaller jack or a calibration that covers it.`;
    case 'unusable':
      return `No gauge pressure for a jack force of ${jackForceKn.toFixed(1)} kN: ${r.detail ?? 'the jack calibration cannot give one.'}`;
  }
}
