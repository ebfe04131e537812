import type { SignoffState } from '@shared/schemas/signoff';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { SelectField } from '../../../components/form-field';
import { EmptyState } from '../../../components/query-states';
import { paths } from '../../../config/paths';
import { formatDate } from '../../../lib/format';
import { reportFiles } from '../api/get-reports';

/** One finished run's report as staff follow it from draft to signature. */
export interface ReportRow {
  runId: number;
  projectCode: string;
  pitId: string;
  planName: string;
  finishedAt: string | null;
  state: SignoffState;
  interpreted: boolean;
}

export const STATE_WORDS: Record<SignoffState, string> = { draft: 'Draft', 'in-review': 'In review', signed: 'Signed' };

/** What a report in each state still needs, in words. */
function nextStep(row: ReportRow): string {
  if (row.state === 'signed') return 'Signed: ready for the client';
  if (row.state === 'in-review') return 'Waiting for a signature';
  return row.interpreted ? 'Interpreted: review and submit' : 'Not interpreted yet';
}

/** Every report, drafts and reports in review as well as signed ones, filtered by state and project. */
export function ReportsBoard({ rows }: { rows: ReportRow[] }) {
  const [state, setState] = useState<'' | SignoffState>('');
  const [project, setProject] = useState('');
  const projects = [...new Set(rows.map((r) => r.projectCode))].sort();
  const shown = rows.filter((r) => (state === '' || r.state === state) && (project === '' || r.projectCode === project));
  const count = (s: SignoffState) => rows.filter((r) => r.state === s).length;
  return (
    <div className="flex flex-col gap-4">
      <form aria-label="Filter reports" className="grid max-w-2xl gap-3 sm:grid-cols-2" onSubmit={(e) => e.preventDefault()}>
        <SelectField
          label="State"
          value={state}
          onChange={(e) => setState(e.target.value as '' | SignoffState)}
          options={[
            { value: '', label: `All (${rows.length})` },
            ...(['draft', 'in-review', 'signed'] as const).map((s) => ({ value: s, label: `${STATE_WORDS[s]} (${count(s)})` })),
          ]}
        />
        <SelectField
          label="Project"
          value={project}
          onChange={(e) => setProject(e.target.value)}
          options={[{ value: '', label: 'All projects' }, ...projects.map((p) => ({ value: p, label: p }))]}
        />
      </form>
      {shown.length === 0 ? (
        <EmptyState title="No report matches">Finished runs appear here from their first draft; change the filters to see more.</EmptyState>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-left">
            <caption className="sr-only">Reports</caption>
            <thead>
              <tr className="border-b-2 border-neutral-700">
                <th className="py-2 pr-3">Run</th>
                <th className="py-2 pr-3">Project · pit</th>
                <th className="py-2 pr-3">Finished</th>
                <th className="py-2 pr-3">State</th>
                <th className="py-2">Next</th>
              </tr>
            </thead>
            <tbody>
              {shown.map((r) => {
                const files = reportFiles(r.runId);
                return (
                  <tr key={r.runId} className="border-b border-neutral-300 align-top">
                    <td className="py-2 pr-3 font-mono">{r.runId}</td>
                    <td className="py-2 pr-3">
                      <span className="font-mono">{r.projectCode}</span> · pit {r.pitId}
                      <span className="block text-sm text-neutral-800">{r.planName}</span>
                    </td>
                    <td className="py-2 pr-3 font-mono">{r.finishedAt ? formatDate(r.finishedAt) : '—'}</td>
                    <td className="py-2 pr-3 font-semibold">{STATE_WORDS[r.state]}</td>
                    <td className="py-2">
                      <span className="block">{nextStep(r)}</span>
                      <span className="flex flex-wrap gap-x-3">
                        {!r.interpreted && r.state === 'draft' ? (
                          <Link to={paths.interpretation.href(r.runId)} className="inline-flex min-h-touch items-center font-semibold">
                            Interpret
                          </Link>
                        ) : (
                          <Link to={paths.signoff.href(r.runId)} className="inline-flex min-h-touch items-center font-semibold">
                            Sign-off
                          </Link>
                        )}
                        {r.state === 'signed' && (
                          <>
                            <a href={files.pdf} className="inline-flex min-h-touch items-center font-semibold">
                              Report (PDF)
                            </a>
                            <a href={files.csv} className="inline-flex min-h-touch items-center font-semibold">
                              Readings (CSV)
                            </a>
                          </>
                        )}
                      </span>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
