import { useWatch } from 'react-hook-form';
import type { PlanFormValues } from '../utils/plan-draft';
import { type Options, PlanKindSelect, PlanList, PlanNumber, PlanSection, useKindChooser } from './plan-inputs';

const HOLD_KINDS: Options = [
  { value: 'rate', label: 'Settlement rate below a threshold' },
  { value: 'consecutive', label: 'Small changes over consecutive intervals' },
  { value: 'fixed', label: 'A fixed duration' },
  { value: 'percentOfUltimate', label: 'A share of the probable final settlement of the stage' },
];

const SCHEDULE_KINDS: Options = [
  { value: 'list', label: 'At listed times after each step' },
  { value: 'interval', label: 'At a fixed interval' },
];

export function HoldRuleFields() {
  const kind = useWatch<PlanFormValues, 'holdRule.kind'>({ name: 'holdRule.kind' });
  const chooseKind = useKindChooser('holdRule');
  return (
    <PlanSection title="When a hold is satisfied" sourcePath="holdRule">
      <PlanKindSelect path="holdRule.kind" options={HOLD_KINDS} onChoose={chooseKind} />
      <div className="grid gap-4 sm:grid-cols-3">
        {kind === 'rate' && (
          <>
            <PlanNumber path="holdRule.maxRateMmPerMin" />
            <PlanNumber path="holdRule.windowMin" hint="Least-squares slope over this window." />
            <PlanNumber path="holdRule.minHoldMin" />
          </>
        )}
        {kind === 'consecutive' && (
          <>
            <PlanNumber path="holdRule.maxChangeMm" />
            <PlanNumber path="holdRule.intervalMin" />
            <PlanNumber path="holdRule.intervals" />
          </>
        )}
        {kind === 'fixed' && <PlanNumber path="holdRule.durationMin" />}
        {kind === 'percentOfUltimate' && (
          <>
            <PlanNumber path="holdRule.percent" />
            <PlanNumber path="holdRule.minHoldMin" />
            <PlanNumber path="holdRule.maxHoldMin" />
          </>
        )}
      </div>
    </PlanSection>
  );
}

export function ReadingScheduleFields() {
  const kind = useWatch<PlanFormValues, 'readingSchedule.kind'>({ name: 'readingSchedule.kind' });
  const chooseKind = useKindChooser('readingSchedule');
  return (
    <PlanSection title="Reading schedule" sourcePath="readingSchedule">
      <PlanKindSelect path="readingSchedule.kind" options={SCHEDULE_KINDS} onChoose={chooseKind} />
      {kind === 'list' ? (
        <div className="grid gap-4 sm:grid-cols-[2fr_1fr]">
          <PlanList path="readingSchedule.minutes" />
          <PlanNumber path="readingSchedule.thenEveryMin" />
        </div>
      ) : (
        <PlanNumber path="readingSchedule.everyMin" />
      )}
    </PlanSection>
  );
}

export function TerminationFields() {
  return (
    <PlanSection title="Stop rules" sourcePath="termination">
      <div className="grid gap-4 sm:grid-cols-3">
        <PlanNumber path="termination.maxSettlementMm" />
        <PlanNumber path="termination.maxSettlementFractionOfWidth" />
        <PlanNumber path="termination.maxHoldMin" />
      </div>
    </PlanSection>
  );
}
