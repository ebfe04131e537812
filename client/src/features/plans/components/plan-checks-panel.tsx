import type { PlanCheck } from '@shared/schemas/plans';
import type { DraftAssessment } from '../utils/plan-draft';
import { planFieldLabel } from '../utils/plan-fields';

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

/** The shared plan self-check, run on every edit. Warnings never block saving; they say why. */
export function PlanChecksPanel({ assessment }: { assessment: DraftAssessment }) {
  if (!assessment.complete) {
    return (
      <section aria-labelledby="plan-checks-title" className="flex flex-col gap-2">
        <h2 id="plan-checks-title" className="text-lg font-bold">
          Plan check
        </h2>
        <p className="text-neutral-800">The check runs once these settings are complete and valid:</p>
        <ul className="list-disc pl-5">
          {assessment.waitingFor.map((label) => (
            <li key={label}>{label}</li>
          ))}
        </ul>
      </section>
    );
  }
  const warnings = assessment.checks.filter((c) => c.severity === 'warning').length;
  const notes = assessment.checks.length - warnings;
  return (
    <section aria-labelledby="plan-checks-title" className="flex flex-col gap-2">
      <h2 id="plan-checks-title" className="text-lg font-bold">
        Plan check
      </h2>
      <p aria-live="polite" className="font-semibold">
        {assessment.checks.length === 0 ? 'No warnings against the rules checked here.' : `${plural(warnings, 'warning')}, ${plural(notes, 'note')}`}
      </p>
      <ul className="flex flex-col gap-2">
        {assessment.checks.map((check) => (
          <CheckItem key={check.code} check={check} />
        ))}
      </ul>
    </section>
  );
}

function CheckItem({ check }: { check: PlanCheck }) {
  const warning = check.severity === 'warning';
  return (
    <li className={warning ? 'rounded-md border-2 border-caution-700 bg-caution-50 p-3 text-caution-950' : 'rounded-md border-2 border-neutral-400 p-3'}>
      <p className="font-bold">
        <span aria-hidden="true">{warning ? '⚠ ' : 'ℹ '}</span>
        {warning ? 'Warning' : 'Note'}
        {check.field && <span className="font-normal"> · {planFieldLabel(check.field)}</span>}
      </p>
      <p>{check.message}</p>
    </li>
  );
}
