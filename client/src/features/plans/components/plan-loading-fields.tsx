import { useFormContext, useWatch } from 'react-hook-form';
import type { PlanFormValues } from '../utils/plan-draft';
import { type Options, PlanKindSelect, PlanList, PlanNumber, PlanSection, useKindChooser } from './plan-inputs';

const LOADING_MODES: Options = [
  { value: 'list', label: 'Listed pressures' },
  { value: 'rule', label: 'Equal steps: the smaller of a fixed step and a fraction of the expected ultimate' },
];

const RELOAD_MODES: Options = [
  { value: 'none', label: 'No second loading' },
  { value: 'toPenultimate', label: 'Back up through the loading stages to the one before last' },
  { value: 'list', label: 'Listed pressures' },
];

export function LoadingFields() {
  const mode = useWatch<PlanFormValues, 'loading.mode'>({ name: 'loading.mode' });
  const chooseMode = useKindChooser('loading');
  return (
    <PlanSection title="Loading increments" sourcePath="loading">
      <PlanKindSelect path="loading.mode" options={LOADING_MODES} onChoose={chooseMode} />
      {mode === 'list' ? (
        <PlanList path="loading.pressuresKpa" hint="Plate pressures of the increments, rising." />
      ) : (
        <div className="grid gap-4 sm:grid-cols-2">
          <PlanNumber path="loading.fixedStepKpa" />
          <PlanNumber path="loading.fractionOfUltimate" hint="0.2 = a fifth." />
          <PlanNumber path="loading.expectedUltimateKpa" />
          <PlanNumber path="loading.maxPressureKpa" />
        </div>
      )}
    </PlanSection>
  );
}

export function UnloadReloadFields() {
  const { setValue } = useFormContext<PlanFormValues>();
  const reloadMode = useWatch<PlanFormValues, 'unloadReload.reload.mode'>({ name: 'unloadReload.reload.mode' });
  const chooseReload = (mode: string) =>
    setValue('unloadReload.reload', mode === 'list' ? { mode: 'list', pressuresKpa: [] } : { mode: mode === 'toPenultimate' ? 'toPenultimate' : 'none' }, {
      shouldDirty: true,
    });
  return (
    <PlanSection title="Unloading and second loading" sourcePath="unloadReload">
      <PlanList path="unloadReload.unloadKpa" hint="Pressures to unload through after the last increment; leave empty to release at once." />
      <PlanKindSelect path="unloadReload.reload.mode" options={RELOAD_MODES} onChoose={chooseReload} />
      {reloadMode === 'list' && <PlanList path="unloadReload.reload.pressuresKpa" />}
      <PlanNumber path="unloadReload.repetitionsPerLevel" hint="Apply and release each level this many times; 1 for a plain test." />
    </PlanSection>
  );
}
