import { DataTable, type DataTableColumns, MonoCell, tableColumns } from '../../../components/data-table';
import { EmptyState } from '../../../components/query-states';
import type { InterpretationVersion } from '../api/interpretation-versions';
import { figure } from './finding';
import { METHOD_OPTIONS } from './settings-form';

const column = tableColumns<InterpretationVersion>();
const methodLabel = (m: string | null) => METHOD_OPTIONS.find((o) => o.value === m)?.label ?? m ?? '—';

const columns: DataTableColumns<InterpretationVersion> = [
  column.accessor('version', { header: 'Version', sortFn: 'basic', cell: (info) => <MonoCell>{info.getValue()}</MonoCell> }),
  column.accessor('createdAt', {
    header: 'Saved (UTC)',
    sortFn: 'alphanumeric',
    cell: (info) => <MonoCell>{info.getValue().slice(0, 16).replace('T', ' ')}</MonoCell>,
  }),
  column.accessor((v) => v.createdByName ?? '—', { id: 'by', header: 'By', sortFn: 'text' }),
  column.accessor((v) => methodLabel(v.chosenMethod), { id: 'method', header: 'Chosen method', sortFn: 'text' }),
  column.accessor((v) => v.qUltKpa ?? -1, {
    id: 'qUlt',
    header: 'q_ult',
    sortFn: 'basic',
    cell: (info) => <MonoCell>{figure(info.row.original.qUltKpa, 'kPa')}</MonoCell>,
  }),
  column.accessor((v) => v.allowableKpa ?? -1, {
    id: 'allowable',
    header: 'Allowable',
    sortFn: 'basic',
    cell: (info) => <MonoCell>{figure(info.row.original.allowableKpa, 'kPa')}</MonoCell>,
  }),
  column.accessor('reason', { header: 'Reason', sortFn: 'text' }),
];

/** The saved interpretations of a run, newest first. */
export function VersionsList({ versions }: { versions: InterpretationVersion[] }) {
  if (versions.length === 0) return <EmptyState title="No interpretation saved yet." />;
  return <DataTable caption="Saved interpretations" columns={columns} data={versions} initialSorting={[{ id: 'version', desc: true }]} />;
}
