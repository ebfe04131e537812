import { Link } from 'react-router-dom';
import { EmptyState } from '../../../components/query-states';
import { paths } from '../../../config/paths';
import { type ReportListItem, reportFiles } from '../api/get-reports';

/** Signed reports with their downloads; `showClient` (staff) adds the client organisation and a link to the run's sign-off. */
export function ReportsList({ reports, showClient }: { reports: ReportListItem[]; showClient: boolean }) {
  if (reports.length === 0) return <EmptyState title="No signed reports yet">A report appears here once its engineer has signed it.</EmptyState>;
  return (
    // On a phone the table scrolls sideways inside its box, not the whole page.
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">Signed reports</caption>
        <thead>
          <tr className="border-b-2 border-neutral-700">
            <th className="py-2 pr-3">Project</th>
            {showClient && <th className="py-2 pr-3">Client</th>}
            <th className="py-2 pr-3">Pit</th>
            <th className="py-2 pr-3">Test date</th>
            <th className="py-2 pr-3">Revision</th>
            <th className="py-2 pr-3">Signed</th>
            <th className="py-2">Files</th>
          </tr>
        </thead>
        <tbody>
          {reports.map((r) => {
            const files = reportFiles(r.runId);
            return (
              <tr key={r.runId} className="border-b border-neutral-300 align-top">
                <td className="py-2 pr-3">
                  <span className="font-mono">{r.projectCode}</span> {r.projectName}
                </td>
                {showClient && <td className="py-2 pr-3">{r.organizationName}</td>}
                <td className="py-2 pr-3 font-mono">{r.pitId}</td>
                <td className="py-2 pr-3 font-mono">{r.testDate ?? '—'}</td>
                <td className="py-2 pr-3 font-mono">{r.revision}</td>
                <td className="py-2 pr-3 font-mono">{r.signedAt ? r.signedAt.slice(0, 10) : '—'}</td>
                <td className="py-2">
                  <a href={files.pdf} className="mr-3 font-semibold">
                    Report (PDF)
                  </a>
                  <a href={files.csv} className="mr-3 font-semibold">
                    Readings (CSV)
                  </a>
                  <a href={files.signedData} className="mr-3 font-semibold" title="The signed data; its SHA-256 in RFC 8785 canonical form is the hash printed on the signed PDF">
                    Signed data (JSON)
                  </a>
                  {showClient && (
                    <Link to={paths.signoff.href(r.runId)} className="font-semibold">
                      Sign-off
                    </Link>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
