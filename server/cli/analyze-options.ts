import { type InterpretationSettings, interpretationSettings } from '@shared/schemas/interpretation';
import { BadInputError } from './load-record';

/** The design flags of `npm run analyze`, in a practitioner's words, and the setting each one fills. */
const DESIGN_FLAGS = {
  method: 'ultimateMethod',
  'footing-shape': 'footingShape',
  'footing-width': 'footingWidthM',
  'footing-length': 'footingLengthM',
  soil: 'soilBehaviour',
  'settlement-limit': 'permissibleSettlementMm',
  'safety-factor': 'factorOfSafety',
  depth: 'foundationDepthM',
  'unit-weight': 'unitWeightKnM3',
  'column-load': 'columnLoadKn',
  scaling: 'settlementScaling',
  'bond-n': 'bondExponent',
  application: 'kApplication',
  'ev-convention': 'evConvention',
  'ev2-required': 'evRequiredMnM2',
  'ev-ratio-max': 'evMaxRatio',
  'ev-relax': 'evRelaxFraction',
  'unsoaked-mm': 'unsoakedDeformationMm',
  'soaked-mm': 'soakedDeformationMm',
} as const satisfies Record<string, keyof InterpretationSettings>;

/** The method names the command line takes, for the methods' own keys. */
const METHOD_WORDS: Record<string, NonNullable<InterpretationSettings['ultimateMethod']>> = {
  'log-log': 'logLogIntersection',
  tangent: 'tangentIntersection',
  hyperbolic: 'hyperbolic',
  criterion: 'settlementCriterion',
  'brinch-hansen': 'brinchHansen80',
  'brinch-hansen-90': 'brinchHansen90',
  'largest-pressure': 'largestPressure',
};
const SOIL_WORDS: Record<string, NonNullable<InterpretationSettings['soilBehaviour']>> = { sand: 'cohesionless', clay: 'cohesive', cohesionless: 'cohesionless', cohesive: 'cohesive' };
const SCALING_WORDS: Record<string, NonNullable<InterpretationSettings['settlementScaling']>> = {
  'terzaghi-peck': 'terzaghiPeckSand',
  das: 'dasSand',
  'linear-clay': 'clayLinear',
  bond: 'bond',
};
const EV_WORDS: Record<string, NonNullable<InterpretationSettings['evConvention']>> = { 'first-loading': 'firstLoadingMax', 'each-branch': 'branchMax' };

export const DESIGN_USAGE = `Design inputs (optional; the record's footing otherwise):
  --method NAME            ultimate pressure carried to the footing: ${Object.keys(METHOD_WORDS).join(', ')}
                           (default: the lowest ultimate within the test, else q_ult ≥ the largest pressure)
  --footing-shape SHAPE    square, circular, strip or rectangular
  --footing-width M        footing width, m
  --footing-length M       length of a rectangular footing, m
  --soil SOIL              sand (cohesionless) or clay (cohesive)
  --settlement-limit MM    permissible footing settlement, mm (default 25)
  --safety-factor FS       on the net ultimate pressure (default 3)
  --depth M                depth of the footing base below ground, m
  --unit-weight KN_M3      unit weight of the soil above the base, kN/m³
  --column-load KN         column load: the square footing width that keeps the settlement limit
  --scaling RULE           settlement from plate to footing: ${Object.keys(SCALING_WORDS).join(', ')}
                           (default: terzaghi-peck on sand, linear-clay on clay)
  --bond-n N               Bond's exponent, 0.03 (clay) to 0.5 (dense sand), with --scaling bond
  --application N          repeated loading: which application of each level gives k (default the procedure's)
  --ev-convention NAME     first-loading or each-branch (σ0max of Ev2)
  --ev2-required MN_M2     the contract's required Ev2: checks Ev2 and Ev2/Ev1 against it
  --ev-ratio-max R         the contract's largest Ev2/Ev1
  --ev-relax F             a higher ratio is accepted when Ev1 ≥ F × the required Ev2
  --unsoaked-mm MM, --soaked-mm MM
                           consolidometer deformations under the test pressure: k corrected to soaked conditions`;

export const DESIGN_OPTIONS = Object.fromEntries(Object.keys(DESIGN_FLAGS).map((flag) => [flag, { type: 'string' as const }])) as Record<
  keyof typeof DESIGN_FLAGS,
  { type: 'string' }
>;

/** A setting's flag, for messages: `footingWidthM` → `--footing-width`. */
export function flagOf(setting: string): string {
  const flag = Object.entries(DESIGN_FLAGS).find(([, key]) => key === setting)?.[0];
  return flag ? `--${flag}` : setting;
}

/** The design settings from parsed flags, checked by the same schema as the page's; a bad value names its flag. */
export function designSettings(values: Partial<Record<keyof typeof DESIGN_FLAGS, string | undefined>>): InterpretationSettings {
  const raw: Record<string, string> = {};
  for (const [flag, key] of Object.entries(DESIGN_FLAGS) as [keyof typeof DESIGN_FLAGS, keyof InterpretationSettings][]) {
    const text = values[flag];
    if (text === undefined) continue;
    const words = flag === 'method' ? METHOD_WORDS : flag === 'soil' ? SOIL_WORDS : flag === 'ev-convention' ? EV_WORDS : flag === 'scaling' ? SCALING_WORDS : null;
    if (words && !(text in words)) throw new BadInputError(`--${flag}: "${text}" is not one of ${Object.keys(words).join(', ')}`);
    raw[key] = words ? words[text] : text;
  }
  const parsed = interpretationSettings.safeParse(raw);
  if (parsed.success) return parsed.data;
  const issue = parsed.error.issues[0];
  throw new BadInputError(`${flagOf(String(issue.path[0]))}: ${issue.message}`);
}

