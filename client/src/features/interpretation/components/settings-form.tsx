import { type FormEvent, useState } from 'react';
import { Button } from '../../../components/button';
import { NumberField, SelectField } from '../../../components/form-field';
import { ULTIMATE_METHOD_NAMES, ULTIMATE_METHODS } from '@shared/schemas/interpretation';
import { draftFromSettings, EMPTY_DRAFT, type InterpretationSettings, type SettingsDraft, settingsFromDraft } from '../utils/interpretation-settings';

export const METHOD_OPTIONS = ULTIMATE_METHODS.map((value) => ({ value, label: ULTIMATE_METHOD_NAMES[value] }));

const SHAPES = ['square', 'circular', 'strip', 'rectangular'].map((v) => ({ value: v, label: v }));
const SOILS = [
  { value: 'cohesionless', label: 'cohesionless (sand, gravel)' },
  { value: 'cohesive', label: 'cohesive (clay)' },
];
const SCALINGS = [
  { value: 'terzaghiPeckSand', label: 'Terzaghi & Peck sand rule' },
  { value: 'dasSand', label: 'sand rule, Das form' },
  { value: 'clayLinear', label: 'linear rule for clay' },
  { value: 'bond', label: 'Bond’s rule (give n)' },
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
      <NumberField label="Footing length" unit="m" hint="Rectangular footings: for the shape factor" {...field('footingLengthM')} />
      <SelectField label="Soil behaviour" options={SOILS} placeholder="As in the record" {...field('soilBehaviour')} />
      <SelectField label="Settlement scaling" options={SCALINGS} placeholder="By the soil (sand: Terzaghi & Peck; clay: linear)" {...field('settlementScaling')} />
      <NumberField label="Bond exponent n" hint="0.03 clay … 0.5 dense sand; with Bond’s rule" {...field('bondExponent')} />
      <NumberField label="Permissible settlement" unit="mm" hint="Empty: 25 mm (common practice for footings on sand)" {...field('permissibleSettlementMm')} />
      <NumberField label="Factor of safety" hint="Empty: 3, on the net ultimate pressure" {...field('factorOfSafety')} />
      <NumberField label="Footing depth" unit="m" hint="Base below ground, for the net pressure; empty: 0" {...field('foundationDepthM')} />
      <NumberField label="Unit weight of the soil" unit="kN/m³" hint="Above the footing base; empty: 0" {...field('unitWeightKnM3')} />
      <NumberField label="Column load" unit="kN" hint="Gives the square footing width for the settlement limit" {...field('columnLoadKn')} />
      <NumberField label="Unsoaked specimen deformation" unit="mm" hint="Consolidometer, under the test pressure: for the soaked k" {...field('unsoakedDeformationMm')} />
      <NumberField label="Soaked specimen deformation" unit="mm" hint="Consolidometer, under the test pressure" {...field('soakedDeformationMm')} />
      <NumberField label="Application for k" hint="Repeated loading: which application of each level; empty: the procedure’s" {...field('kApplication')} />
      <SelectField
        label="Ultimate method carried to the footing"
        options={METHOD_OPTIONS}
        placeholder="The lowest ultimate within the test, else q_ult ≥ q_max"
        {...field('ultimateMethod')}
      />
      <SelectField label="Ev2 σ0max convention" options={EV} placeholder="First loading (default)" {...field('evConvention')} />
      <NumberField label="Required Ev2" unit="MN/m²" hint="The contract’s value: checks Ev2 and Ev2/Ev1" {...field('evRequiredMnM2')} />
      <NumberField label="Largest Ev2/Ev1" hint="The contract’s limit; empty: none" {...field('evMaxRatio')} />
      <NumberField label="Ratio relaxed when Ev1 ≥" hint="Fraction of the required Ev2, if the contract allows" {...field('evRelaxFraction')} />
      <div className="flex items-end">
        <Button type="submit" busy={busy} busyLabel="Working…" disabled={Object.keys(errors).length > 0}>
          Apply settings
        </Button>
      </div>
    </form>
  );
}
