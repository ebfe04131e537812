import type { Project } from '@shared/schemas/projects';
import { Link } from 'react-router-dom';
import { LinkButton } from '../../components/button';
import { PageHeader } from '../../components/page-header';
import { EmptyState, QueryResult } from '../../components/query-states';
import { paths } from '../../config/paths';
import { useProjects } from '../../features/projects/api/get-projects';
import { useRuns } from '../../features/runs/api/get-runs';
import { useReadyPlans } from '../../features/runs/api/get-ready-plans';
import { NextRuns } from '../../features/runs/components/next-runs';
import { ReviewQueues } from '../../features/runs/components/review-queues';
import { RunBoard } from '../../features/runs/components/run-board';
import { useCan, useUser } from '../../lib/auth';
import { formatDate } from '../../lib/format';

const RECENT = 6;

function RecentProjects({ projects }: { projects: Project[] }) {
  const canCreate = useCan('projects:write');
  if (projects.length === 0) {
    return (
      <EmptyState title="No projects yet">
        {canCreate ? (
          <LinkButton to={paths.newProject.href()} variant="primary">
            New project
          </LinkButton>
        ) : (
          'Projects you may see will appear here.'
        )}
      </EmptyState>
    );
  }
  const recent = [...projects].sort((a, b) => b.updatedAt.localeCompare(a.updatedAt)).slice(0, RECENT);
  return (
    <>
      <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        {recent.map((p) => (
          <li key={p.id}>
            <Link
              to={paths.project.href(p.id)}
              className="flex min-h-touch flex-col rounded-md border-2 border-neutral-300 p-3 no-underline hover:border-neutral-800"
            >
              <span className="font-mono font-bold">{p.code}</span>
              <span className="text-lg font-semibold">{p.name}</span>
              <span className="text-neutral-800">
                {p.organizationName} · {p.site}
              </span>
              <span className="text-sm text-neutral-800">
                Updated <span className="font-mono">{formatDate(p.updatedAt)}</span>
              </span>
            </Link>
          </li>
        ))}
      </ul>
      {projects.length > RECENT && (
        <Link to={paths.projects.href()} className="mt-3 inline-flex min-h-touch items-center font-semibold underline underline-offset-4">
          All {projects.length} projects
        </Link>
      )}
    </>
  );
}

/** Runs in progress and finished, refreshed every few seconds. */
function RunsOnBoard() {
  const runs = useRuns();
  return (
    <QueryResult query={runs} loadingLabel="Loading runs…">
      {(items) => <RunBoard runs={items} />}
    </QueryResult>
  );
}

/** The engineer's queues, from the same list of runs as the board. */
function QueuesOnBoard() {
  const runs = useRuns();
  return (
    <QueryResult query={runs} loadingLabel="Loading your queues…">
      {(items) => <ReviewQueues runs={items} />}
    </QueryResult>
  );
}

/** Plans waiting for their run: an operator's next runs. */
function NextRunsOnBoard() {
  const plans = useReadyPlans();
  return (
    <QueryResult query={plans} loadingLabel="Loading the next runs…">
      {(items) => <NextRuns plans={items} />}
    </QueryResult>
  );
}

/** Each person's work first: an engineer's queues, an operator's runs; then the projects. */
export function HomeRoute() {
  const user = useUser();
  const projects = useProjects();
  const canRun = useCan('plans:read');
  // Engineers and admins interpret, review and sign (the roles that save interpretations).
  const reviews = useCan('plans:write');
  const runsSection = canRun && (
    <section aria-labelledby="runs-board" className="mb-8">
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 id="runs-board" className="text-xl font-bold">
          {reviews ? 'Runs' : 'Your runs'}
        </h2>
        <LinkButton to={paths.newRun.href()} variant="primary">
          Set up a run
        </LinkButton>
      </div>
      <RunsOnBoard />
    </section>
  );
  return (
    <>
      <PageHeader title={user ? `Hello, ${user.name}` : 'Home'} />
      {reviews && (
        <section aria-labelledby="my-queues" className="mb-8">
          <h2 id="my-queues" className="mb-3 text-xl font-bold">
            Your queues
          </h2>
          <QueuesOnBoard />
        </section>
      )}
      {!reviews && runsSection}
      {canRun && !reviews && (
        <section aria-labelledby="next-runs" className="mb-8">
          <h2 id="next-runs" className="mb-3 text-xl font-bold">
            Next runs
          </h2>
          <NextRunsOnBoard />
        </section>
      )}
      <section aria-labelledby="my-projects" className="mb-8">
        <h2 id="my-projects" className="mb-3 text-xl font-bold">
          My projects
        </h2>
        <QueryResult query={projects} loadingLabel="Loading projects…">
          {(items) => <RecentProjects projects={items} />}
        </QueryResult>
      </section>
      {reviews && runsSection}
    </>
  );
}
