import type { ChosenUltimate, Finding } from '@shared/interpretation/analyze-record';
import type { AnyUltimateResult } from '@shared/interpretation/ultimate';
import { DataTable, type DataTableColumns, MonoCell, tableColumns } from '../../../components/data-table';
import { figure } from './finding';

type Row = AnyUltimateResult & { id: string };
const column = tableColumns<Row>();

const fitText = (r: AnyUltimateResult) => (r.fit ? `${r.fit.measure === 'r2' ? 'R²' : 'SSE'} ${r.fit.value.toFixed(4)}` : '—');

const columns: DataTableColumns<Row> = [
  column.accessor('label', { header: 'Method', sortFn: 'text' }),
  column.accessor((r) => r.qUltKpa ?? -1, {
    id: 'qUlt',
    header: 'q_ult',
    sortFn: 'basic',
    cell: (info) => <MonoCell>{figure(info.row.original.qUltKpa, 'kPa')}</MonoCell>,
  }),
  column.accessor((r) => fitText(r), { id: 'fit', header: 'Fit', sortFn: 'alphanumeric', cell: (info) => <MonoCell>{info.getValue()}</MonoCell> }),
  column.accessor('formula', { header: 'Formula', sortFn: 'text', cell: (info) => <span className="font-mono text-sm">{info.getValue()}</span> }),
  column.accessor('source', { header: 'Source', sortFn: 'text', cell: (info) => <span className="text-sm">{info.getValue()}</span> }),
  column.accessor((r) => r.reason ?? '', { id: 'note', header: 'Note', sortFn: 'text', cell: (info) => <span className="text-sm">{info.getValue()}</span> }),
];

/** Every ultimate-pressure method side by side, and the one carried to the footing. */
export function UltimateMethodsTable({ ultimate, chosen }: { ultimate: Finding<AnyUltimateResult[]>; chosen: Finding<ChosenUltimate> }) {
  if (!ultimate.applies) return <p className="text-neutral-800">No ultimate pressure: {ultimate.reason}</p>;
  return (
    <div className="flex flex-col gap-3">
      <DataTable caption="Ultimate-pressure methods" columns={columns} data={ultimate.result.map((r) => ({ ...r, id: r.method }))} />
      <p aria-live="polite">
        {chosen.applies ? (
          <>
            Carried to the footing: <strong>{chosen.result.label}</strong>, <span className="font-mono">{figure(chosen.result.qUltKpa, 'kPa')}</span> (
            {chosen.result.basis === 'engineer' ? 'the engineer’s choice' : 'the lowest value any method gives'})
          </>
        ) : (
          <>No ultimate pressure carried to the footing: {chosen.reason}</>
        )}
      </p>
    </div>
  );
}
