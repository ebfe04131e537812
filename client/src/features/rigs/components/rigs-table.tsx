import type { Rig } from '@shared/schemas/instruments';
import { CellLink, DataTable, type DataTableColumns, MonoCell, tableColumns } from '../../../components/data-table';
import { paths } from '../../../config/paths';

const column = tableColumns<Rig>();

const MODE_WORDS: Record<Rig['mode'], string> = { serial: 'Serial devices', manual: 'Typed in by hand' };

const baseColumns: DataTableColumns<Rig> = [
  column.accessor('name', {
    header: 'Rig',
    sortFn: 'text',
    cell: (info) => <CellLink to={paths.rigCheck.href(info.row.original.id)}>{info.getValue()}</CellLink>,
  }),
  column.accessor((r) => MODE_WORDS[r.mode], { id: 'mode', header: 'Readings', sortFn: 'text' }),
  column.accessor((r) => r.channels.map((c) => c.key).join(', '), {
    id: 'channels',
    header: 'Channels',
    sortFn: 'alphanumeric',
    cell: (info) => <MonoCell>{info.getValue()}</MonoCell>,
  }),
];

const editorColumns: DataTableColumns<Rig> = [
  ...baseColumns,
  column.display({ id: 'edit', header: 'Set-up', cell: (info) => <CellLink to={paths.editRig.href(info.row.original.id)}>Edit rig</CellLink> }),
];

/** Rigs; the name opens the live device check, and editors also get a link to the set-up. */
export function RigsTable({ rigs, canEdit }: { rigs: Rig[]; canEdit: boolean }) {
  return <DataTable caption="Rigs" columns={canEdit ? editorColumns : baseColumns} data={rigs} initialSorting={[{ id: 'name', desc: false }]} />;
}
