import type { ImportIssue } from '../api/import-record';

const where = (i: ImportIssue) =>
  [i.line !== undefined ? `line ${i.line}` : null, i.group ?? null, i.heading ?? null, i.column ? `column ${i.column}` : null, i.field ?? null]
    .filter(Boolean)
    .join(', ');

const withRule = (i: ImportIssue) => (i.rule && i.rule !== 'settlescope' ? `${i.message} (AGS4 rule ${i.rule})` : i.message);

/** Every problem the server found, by line and column (CSV), field (JSON) or line, group and heading (AGS4), so the file can be mended in one go. */
export function ImportIssues({ message, issues, omitted }: { message: string; issues: readonly ImportIssue[]; omitted: number }) {
  return (
    <section role="alert" aria-labelledby="import-issues" className="rounded-md border-2 border-alarm-700 bg-alarm-50 p-4 text-alarm-900">
      <h2 id="import-issues" className="text-lg font-bold">
        <span aria-hidden="true">✖ </span>Nothing was imported
      </h2>
      <p className="mb-2">{message}</p>
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">Problems in the record</caption>
        <thead>
          <tr>
            <th className="pr-4">Where</th>
            <th>Problem</th>
          </tr>
        </thead>
        <tbody>
          {issues.map((issue, n) => (
            // biome-ignore lint/suspicious/noArrayIndexKey: the list is replaced whole, never reordered
            <tr key={n} className="border-t border-alarm-300">
              <td className="pr-4 font-mono">{where(issue) || '—'}</td>
              <td>{withRule(issue)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {omitted > 0 && <p className="mt-2">…and {omitted} more problems not listed.</p>}
    </section>
  );
}
