import type { SignoffState } from '@shared/schemas/signoff';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { formatDate } from '../../../lib/format';
import type { RunSummary } from '../api/get-runs';

const CLOSED = new Set<RunSummary['phase']>(['completed', 'stopped']);

/** Which queue a closed run waits in: interpretation, review (submit), signature; null once signed or while still running. */
export function queueOf(run: Pick<RunSummary, 'phase' | 'review'>): 'interpret' | 'review' | 'sign' | null {
  if (!CLOSED.has(run.phase)) return null;
  const state: SignoffState = run.review.state;
  if (state === 'signed') return null;
  if (state === 'in-review') return 'sign';
  return run.review.interpreted ? 'review' : 'interpret';
}

const QUEUES = [
  { key: 'interpret', title: 'To interpret', empty: 'No finished run waits for its interpretation.', action: 'Interpret', href: paths.interpretation.href },
  { key: 'review', title: 'To review', empty: 'No interpretation waits to be reviewed and submitted.', action: 'Review and submit', href: paths.signoff.href },
  { key: 'sign', title: 'To sign', empty: 'No report waits for a signature.', action: 'Sign', href: paths.signoff.href },
] as const;

/** The engineer's work: finished runs to interpret, interpretations to review and submit, reports to sign. */
export function ReviewQueues({ runs }: { runs: RunSummary[] }) {
  return (
    <div className="grid gap-4 md:grid-cols-3">
      {QUEUES.map((q) => {
        const items = runs.filter((r) => queueOf(r) === q.key);
        return (
          <section key={q.key} aria-labelledby={`queue-${q.key}`} className="flex flex-col gap-2 rounded-md border-2 border-neutral-300 p-3">
            <h3 id={`queue-${q.key}`} className="text-lg font-bold">
              {q.title} <span className="font-mono font-normal">({items.length})</span>
            </h3>
            {items.length === 0 ? (
              <p className="text-neutral-800">{q.empty}</p>
            ) : (
              <ul className="flex flex-col divide-y divide-neutral-300">
                {items.map((r) => (
                  <li key={r.id} className="flex flex-col py-1">
                    <Link to={q.href(r.id)} className="inline-flex min-h-touch items-center font-bold underline underline-offset-4">
                      {q.action}: run {r.id}
                    </Link>
                    <span className="text-neutral-800">
                      {r.projectCode} · pit {r.pitId} · {r.planName}
                      {r.finishedAt && (
                        <>
                          {' '}
                          · <span className="font-mono">{formatDate(r.finishedAt)}</span>
                        </>
                      )}
                    </span>
                  </li>
                ))}
              </ul>
            )}
          </section>
        );
      })}
    </div>
  );
}
