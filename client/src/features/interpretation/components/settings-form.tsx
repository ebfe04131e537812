import { type FormEvent, useState } from 'react';
import { Button } from '../../../components/button';
import { NumberField, SelectField } from '../../../components/form-field';
import { draftFromSettings, EMPTY_DRAFT, type InterpretationSettings, type SettingsDraft, settingsFromDraft } from '../utils/interpretation-settings';

export const METHOD_OPTIONS = [
  { value: 'logLogIntersection', label: 'Log–log two-line intersection' },
  { value: 'tangentIntersection', label: 'Tangent intersection' },
  { value: 'hyperbolic', label: 'Hyperbolic asymptote' },
  { value: 'settlementCriterion', label: 'Settlement criterion' },
  { value: 'brinchHansen80', label: 'Brinch Hansen 80 %' },
] as const;

const SHAPES = ['square', 'circular', 'strip', 'rectangular'].map((v) => ({ value: v, label: v }));
const SOILS = [
  { value: 'cohesionless', label: 'cohesionless (sand, gravel)' },
  { value: 'cohesive', label: 'cohesive (clay)' },
];
const EV = [
  { value: 'firstLoadingMax', label: 'σ0max of the first loading for both' },
  { value: 'branchMax', label: 'each branch’s own σ0max' },
];

/** The engineer's settings: the footing to scale to, allowable-pressure inputs, the ultimate method and the Ev convention. */
export function SettingsForm({ settings, onApply, busy }: { settings: InterpretationSettings; onApply: (s: InterpretationSettings) => void; busy?: boolean }) {
  const [draft, setDraft] = useState<SettingsDraft>(() => ({ ...EMPTY_DRAFT, ...draftFromSettings(settings) }));
  const { errors } = settingsFromDraft(draft);
  const field = (key: keyof SettingsDraft) => ({
    value: draft[key],
    error: errors[key],
    onChange: (e: { target: { value: string } }) => setDraft((d) => ({ ...d, [key]: e.target.value })),
  });
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const parsed = settingsFromDraft(draft);
    if (Object.keys(parsed.errors).length === 0) onApply(parsed.settings);
  };
  return (
    <form onSubmit={submit} aria-label="Interpretation settings" className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
      <SelectField label="Footing shape" options={SHAPES} placeholder="As in the record" {...field('footingShape')} />
      <NumberField label="Footing width" unit="m" hint="Empty: the record’s footing" {...field('footingWidthM')} />
      <SelectField label="Soil behaviour" options={SOILS} placeholder="As in the record" {...field('soilBehaviour')} />
      <NumberField label="Permissible settlement" unit="mm" hint="Empty: 25 mm (common practice for footings on sand)" {...field('permissibleSettlementMm')} />
      <NumberField label="Factor of safety" hint="Empty: 3" {...field('factorOfSafety')} />
      <SelectField
        label="Ultimate method carried to the footing"
        options={METHOD_OPTIONS}
        placeholder="The lowest value (cautious)"
        {...field('ultimateMethod')}
      />
      <SelectField label="Ev2 σ0max convention" options={EV} placeholder="First loading (default)" {...field('evConvention')} />
      <div className="flex items-end">
        <Button type="submit" busy={busy} busyLabel="Working…" disabled={Object.keys(errors).length > 0}>
          Apply settings
        </Button>
      </div>
    </form>
  );
}
