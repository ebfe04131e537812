import { ACTIVE_PHASES } from '@shared/schemas/runs';
import { Link } from 'react-router-dom';
import { EmptyState } from '../../../components/query-states';
import { paths } from '../../../config/paths';
import { formatDate } from '../../../lib/format';
import type { RunSummary } from '../api/get-runs';
import { PHASE_LABELS, VERDICTS } from '../utils/run-format';

function stageText(run: RunSummary): string {
  return run.stageCount === null ? `Stage ${run.stageIndex + 1}` : `Stage ${run.stageIndex + 1} of ${run.stageCount}`;
}

function ActiveRun({ run }: { run: RunSummary }) {
  const verdict = run.verdict ? VERDICTS[run.verdict] : null;
  return (
    <Link
      to={paths.run.href(run.id)}
      aria-label={`Run ${run.id}: ${run.planName}`}
      className="flex min-h-touch flex-col gap-1 rounded-md border-2 border-neutral-800 p-3 no-underline hover:bg-neutral-100"
    >
      <span className="font-mono font-bold">
        {run.projectCode} · pit {run.pitId}
      </span>
      <span className="text-lg font-semibold">{run.planName}</span>
      <span className="text-neutral-800">
        {run.rigName} · {PHASE_LABELS[run.phase]} · {stageText(run)}
      </span>
      <span className="font-semibold">
        {verdict ? (
          <>
            <span aria-hidden="true">{verdict.symbol} </span>
            {verdict.label}
          </>
        ) : (
          'Hold not judged yet'
        )}
      </span>
      <span className={run.activeAlarms > 0 ? 'rounded bg-alarm-50 px-1 font-bold text-alarm-900' : 'text-neutral-800'}>
        <span aria-hidden="true">{run.activeAlarms > 0 ? '✖ ' : '✓ '}</span>
        {run.activeAlarms === 0 ? 'No alarms waiting' : `${run.activeAlarms} alarm${run.activeAlarms === 1 ? '' : 's'} not acknowledged`}
      </span>
    </Link>
  );
}

/** Runs in progress, each linking to its console, and the finished ones below. */
export function RunBoard({ runs }: { runs: RunSummary[] }) {
  const active = runs.filter((r) => ACTIVE_PHASES.includes(r.phase));
  const finished = runs.filter((r) => !ACTIVE_PHASES.includes(r.phase));
  return (
    <div className="flex flex-col gap-4">
      {active.length === 0 ? (
        <EmptyState title="No run in progress">Runs being recorded now will show here, with their stage, hold verdict and alarms.</EmptyState>
      ) : (
        <ul aria-label="Runs in progress" className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {active.map((r) => (
            <li key={r.id}>
              <ActiveRun run={r} />
            </li>
          ))}
        </ul>
      )}
      {finished.length > 0 && (
        <div>
          <h3 className="mb-2 text-lg font-bold">Finished runs</h3>
          <ul aria-label="Finished runs" className="divide-y divide-neutral-300 rounded-md border-2 border-neutral-300">
            {finished.map((r) => (
              <li key={r.id} className="flex flex-wrap items-center gap-x-3 px-3 py-1">
                <Link to={paths.run.href(r.id)} className="inline-flex min-h-touch items-center font-mono font-bold underline underline-offset-4">
                  Run {r.id}
                </Link>
                <span>{r.planName}</span>
                <span className="text-neutral-800">
                  {r.projectCode} · pit {r.pitId} · {PHASE_LABELS[r.phase]}
                  {r.finishedAt && (
                    <>
                      {' '}
                      on <span className="font-mono">{formatDate(r.finishedAt)}</span>
                    </>
                  )}
                </span>
                <Link to={paths.interpretation.href(r.id)} className="inline-flex min-h-touch items-center font-bold underline underline-offset-4">
                  Interpretation
                </Link>
                <Link to={paths.replay.href(r.id)} className="inline-flex min-h-touch items-center font-bold underline underline-offset-4">
                  Replay
                </Link>
                <Link to={paths.signoff.href(r.id)} className="inline-flex min-h-touch items-center font-bold underline underline-offset-4">
                  Sign-off
                </Link>
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
