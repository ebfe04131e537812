import type { ChosenUltimate, Finding, RecordAnalysis } from '@shared/interpretation/analyze-record';
import { type AssessedUltimate, STANDING_LEGEND, STANDING_WORDS } from '@shared/interpretation/ultimate-standing';
import { DataTable, type DataTableColumns, MonoCell, tableColumns } from '../../../components/data-table';
import { figure } from './finding';

type Row = AssessedUltimate & { id: string };
const column = tableColumns<Row>();

const fitText = (r: AssessedUltimate) => (r.fit ? `${r.fit.measure === 'r2' ? 'R²' : 'SSE'} ${r.fit.value.toFixed(4)}` : '—');
const ratio = (x: number | null) => (x === null ? '—' : x.toFixed(2));

const columns: DataTableColumns<Row> = [
  column.accessor('label', { header: 'Method', sortFn: 'text' }),
  column.accessor((r) => r.qUltKpa ?? -1, {
    id: 'qUlt',
    header: 'q_ult',
    sortFn: 'basic',
    cell: (info) => <MonoCell>{figure(info.row.original.qUltKpa, 'kPa')}</MonoCell>,
  }),
  column.accessor((r) => r.qOverQmax ?? -1, { id: 'qRatio', header: 'q_ult/q_max', sortFn: 'basic', cell: (info) => <MonoCell>{ratio(info.row.original.qOverQmax)}</MonoCell> }),
  column.accessor((r) => r.sOverSmax ?? -1, { id: 'sRatio', header: 's/s_max', sortFn: 'basic', cell: (info) => <MonoCell>{ratio(info.row.original.sOverSmax)}</MonoCell> }),
  column.accessor((r) => STANDING_WORDS[r.standing], { id: 'standing', header: 'Standing', sortFn: 'text' }),
  column.accessor((r) => fitText(r), { id: 'fit', header: 'Fit', sortFn: 'alphanumeric', cell: (info) => <MonoCell>{info.getValue()}</MonoCell> }),
  column.accessor('formula', { header: 'Formula', sortFn: 'text', cell: (info) => <span className="font-mono text-sm">{info.getValue()}</span> }),
  column.accessor('source', { header: 'Source', sortFn: 'text', cell: (info) => <span className="text-sm">{info.getValue()}</span> }),
  column.accessor((r) => r.reason ?? '', { id: 'note', header: 'Note', sortFn: 'text', cell: (info) => <span className="text-sm">{info.getValue()}</span> }),
];

/** Every ultimate-pressure method side by side with its standing against the test, and the value carried to the footing. */
export function UltimateMethodsTable({
  ultimate,
  chosen,
  strength,
}: {
  ultimate: Finding<AssessedUltimate[]>;
  chosen: Finding<ChosenUltimate>;
  strength?: RecordAnalysis['undrainedStrength'];
}) {
  if (!ultimate.applies) return <p className="text-neutral-800">No ultimate pressure: {ultimate.reason}</p>;
  return (
    <div className="flex flex-col gap-3">
      <DataTable caption="Ultimate-pressure methods" columns={columns} data={ultimate.result.map((r) => ({ ...r, id: r.method }))} />
      <p className="text-sm text-neutral-700">{STANDING_LEGEND}</p>
      <p aria-live="polite">
        {chosen.applies ? (
          <>
            Carried to the footing: <strong>{chosen.result.statement}</strong>
          </>
        ) : (
          <>No ultimate pressure carried to the footing: {chosen.reason}</>
        )}
      </p>
      {strength?.applies && (
        <p>
          Undrained shear strength: <strong>{strength.result.statement}</strong>{' '}
          <span className="text-sm text-neutral-700">
            ({strength.result.formula}; {strength.result.source})
          </span>
        </p>
      )}
    </div>
  );
}
