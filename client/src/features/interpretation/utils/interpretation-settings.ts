import type { UltimateMethod } from '@shared/interpretation/ultimate';

/** The engineer's settings, as the API's interpretation query and save body take them. Absent = the record's value or the method's default. */
export interface InterpretationSettings {
  footingShape?: 'square' | 'circular' | 'strip' | 'rectangular';
  /** m */
  footingWidthM?: number;
  soilBehaviour?: 'cohesionless' | 'cohesive';
  /** mm */
  permissibleSettlementMm?: number;
  factorOfSafety?: number;
  ultimateMethod?: UltimateMethod;
  evConvention?: 'firstLoadingMax' | 'branchMax';
}

/** The query string of the settings that are set, in a stable order (so equal settings share a cache entry). */
export function settingsQuery(settings: InterpretationSettings): string {
  const entries = Object.entries(settings)
    .filter(([, v]) => v !== undefined && v !== '')
    .sort(([a], [b]) => a.localeCompare(b));
  return entries.length ? `?${new URLSearchParams(entries.map(([k, v]) => [k, String(v)])).toString()}` : '';
}

/** The settings that are set, without empty ones. */
export function definedSettings(settings: InterpretationSettings): InterpretationSettings {
  return Object.fromEntries(Object.entries(settings).filter(([, v]) => v !== undefined && v !== '')) as InterpretationSettings;
}

/** The settings form's text, one string per field ('' = not set). */
export type SettingsDraft = Record<keyof InterpretationSettings, string>;

export const EMPTY_DRAFT: SettingsDraft = {
  footingShape: '',
  footingWidthM: '',
  soilBehaviour: '',
  permissibleSettlementMm: '',
  factorOfSafety: '',
  ultimateMethod: '',
  evConvention: '',
};

const NUMBER_FIELDS = { footingWidthM: [0, 50], permissibleSettlementMm: [0, 500], factorOfSafety: [1, 10] } as const;

/** Settings from the form, or the problem of each field that is not a usable number (ranges as the server checks them). */
export function settingsFromDraft(draft: SettingsDraft): { settings: InterpretationSettings; errors: Partial<Record<keyof InterpretationSettings, string>> } {
  const errors: Partial<Record<keyof InterpretationSettings, string>> = {};
  const settings: Record<string, string | number> = {};
  for (const [key, text] of Object.entries(draft) as [keyof InterpretationSettings, string][]) {
    const value = text.trim();
    if (value === '') continue;
    if (key in NUMBER_FIELDS) {
      const [low, high] = NUMBER_FIELDS[key as keyof typeof NUMBER_FIELDS];
      const n = Number(value);
      if (!Number.isFinite(n)) errors[key] = 'Enter a number.';
      else if (n < low || n > high || (low === 0 && n === 0))
        errors[key] = low === 0 ? `Enter a number above 0 and at most ${high}.` : `Enter a number from ${low} to ${high}.`;
      else settings[key] = n;
    } else settings[key] = value;
  }
  return { settings: settings as InterpretationSettings, errors };
}

/** The form's text for saved or current settings. */
export function draftFromSettings(settings: InterpretationSettings): SettingsDraft {
  return Object.fromEntries(Object.keys(EMPTY_DRAFT).map((k) => [k, String(settings[k as keyof InterpretationSettings] ?? '')])) as SettingsDraft;
}
