import { LinkButton } from '../../../components/button';
import { EmptyState } from '../../../components/query-states';
import { paths } from '../../../config/paths';
import { formatDate } from '../../../lib/format';
import type { ReadyPlan } from '../api/get-ready-plans';

/** Plans written and not yet run, newest first, each one press from its run's set-up. */
export function NextRuns({ plans }: { plans: ReadyPlan[] }) {
  if (plans.length === 0) return <EmptyState title="No plan waiting">Plans an engineer writes show here until their run is set up.</EmptyState>;
  return (
    <ul aria-label="Next runs" className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
      {plans.map((p) => (
        <li key={p.id} className="flex flex-col gap-1 rounded-md border-2 border-neutral-300 p-3">
          <span className="font-mono font-bold">
            {p.projectCode} · pit {p.pitId}
          </span>
          <span className="text-lg font-semibold">{p.name}</span>
          <span className="text-sm text-neutral-800">
            Planned <span className="font-mono">{formatDate(p.createdAt)}</span>
          </span>
          <LinkButton to={paths.newRun.href(p.id)} variant="primary" className="mt-1 self-start" aria-label={`Set up the run of ${p.name}`}>
            Set up the run
          </LinkButton>
        </li>
      ))}
    </ul>
  );
}
