import type { InterpretationSettings } from '@shared/schemas/interpretation';

/** The engineer's settings and design inputs, as the API's interpretation query and save body take them (one schema, shared/schemas/interpretation.ts). */
export type { InterpretationSettings };

/** The query string of the settings that are set, in a stable order (so equal settings share a cache entry). */
export function settingsQuery(settings: InterpretationSettings): string {
  const entries = Object.entries(settings)
    .filter(([, v]) => v !== undefined && String(v) !== '')
    .sort(([a], [b]) => a.localeCompare(b));
  return entries.length ? `?${new URLSearchParams(entries.map(([k, v]) => [k, String(v)])).toString()}` : '';
}

/** The settings that are set, without empty ones. */
export function definedSettings(settings: InterpretationSettings): InterpretationSettings {
  return Object.fromEntries(Object.entries(settings).filter(([, v]) => v !== undefined && String(v) !== '')) as InterpretationSettings;
}

/** The settings form's text, one string per field ('' = not set). */
export type SettingsDraft = Record<keyof InterpretationSettings, string>;

export const EMPTY_DRAFT: SettingsDraft = {
  footingShape: '',
  footingWidthM: '',
  footingLengthM: '',
  soilBehaviour: '',
  permissibleSettlementMm: '',
  factorOfSafety: '',
  foundationDepthM: '',
  unitWeightKnM3: '',
  columnLoadKn: '',
  ultimateMethod: '',
  evConvention: '',
  kApplication: '',
  evRequiredMnM2: '',
  evMaxRatio: '',
  evRelaxFraction: '',
  unsoakedDeformationMm: '',
  soakedDeformationMm: '',
  settlementScaling: '',
  bondExponent: '',
};

/** [lowest, highest, whether the lowest itself is allowed, whole numbers only], as the server's schema checks them. */
const NUMBER_FIELDS: Partial<Record<keyof InterpretationSettings, readonly [number, number, boolean, boolean?]>> = {
  footingWidthM: [0, 50, false],
  footingLengthM: [0, 200, false],
  permissibleSettlementMm: [0, 500, false],
  factorOfSafety: [1, 10, true],
  foundationDepthM: [0, 50, true],
  unitWeightKnM3: [0, 30, true],
  columnLoadKn: [0, 100_000, false],
  kApplication: [1, 20, true, true],
  evRequiredMnM2: [0, 1000, false],
  evMaxRatio: [1, 10, true],
  evRelaxFraction: [0, 1, false],
  unsoakedDeformationMm: [0, 100, false],
  bondExponent: [0, 1, true],
  soakedDeformationMm: [0, 100, false],
};

/** Settings from the form, or the problem of each field that is not a usable number (ranges as the server checks them). */
export function settingsFromDraft(draft: SettingsDraft): { settings: InterpretationSettings; errors: Partial<Record<keyof InterpretationSettings, string>> } {
  const errors: Partial<Record<keyof InterpretationSettings, string>> = {};
  const settings: Record<string, string | number> = {};
  for (const [key, text] of Object.entries(draft) as [keyof InterpretationSettings, string][]) {
    const value = text.trim();
    if (value === '') continue;
    const range = NUMBER_FIELDS[key];
    if (range) {
      const [low, high, lowAllowed, whole] = range;
      const n = Number(value);
      if (!Number.isFinite(n)) errors[key] = 'Enter a number.';
      else if (whole && !Number.isInteger(n)) errors[key] = `Enter a whole number from ${low} to ${high}.`;
      else if (n < low || n > high || (!lowAllowed && n === low))
        errors[key] = lowAllowed ? `Enter a number from ${low} to ${high}.` : `Enter a number above ${low} and at most ${high}.`;
      else settings[key] = n;
    } else settings[key] = value;
  }
  return { settings: settings as InterpretationSettings, errors };
}

/** The form's text for saved or current settings. */
export function draftFromSettings(settings: InterpretationSettings): SettingsDraft {
  return Object.fromEntries(Object.keys(EMPTY_DRAFT).map((k) => [k, String(settings[k as keyof InterpretationSettings] ?? '')])) as SettingsDraft;
}
