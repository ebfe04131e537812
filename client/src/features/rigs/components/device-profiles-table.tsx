import type { DeviceProfile, ListedDeviceProfile } from '@shared/devices/schema';
import { CellLink, DataTable, type DataTableColumns, MonoCell, tableColumns } from '../../../components/data-table';
import { paths } from '../../../config/paths';

const column = tableColumns<ListedDeviceProfile>();

const WORD_ORDER_WORDS = { 'high-first': 'high word first', 'low-first': 'low word first' } as const;

/** One line of what the profile reads: "FC 04, register 2, float32 high word first, MPa". */
export function profileSummary(p: DeviceProfile): string {
  const line = `${p.serial.baudRate} Bd ${p.serial.dataBits}${p.serial.parity[0].toUpperCase()}${p.serial.stopBits}`;
  if (p.protocol === 'ascii') return `ASCII ${p.mode}, ${p.unit}, ${line}`;
  const order = p.format.endsWith('32') ? ` ${WORD_ORDER_WORDS[p.wordOrder]}` : '';
  const bytes = p.byteOrder === 'swapped' ? ', bytes swapped' : '';
  const scaling = p.scale !== 1 || p.offset !== 0 ? ` × ${p.scale} + ${p.offset}` : '';
  return `Slave ${p.unitId}, FC ${String(p.functionCode).padStart(2, '0')}, register ${p.register}, ${p.format}${order}${bytes}${scaling} ${p.unit}, ${line}`;
}

const baseColumns: DataTableColumns<ListedDeviceProfile> = [
  column.accessor('id', { header: 'Profile id', sortFn: 'text', cell: (info) => <MonoCell>{info.getValue()}</MonoCell> }),
  column.accessor('name', { header: 'Name', sortFn: 'text' }),
  column.accessor((p) => (p.source === 'lab' ? 'Lab' : 'Built in'), { id: 'source', header: 'Source', sortFn: 'text' }),
  column.accessor((p) => profileSummary(p), { id: 'reads', header: 'Reads', sortFn: 'text' }),
];

const adminColumns: DataTableColumns<ListedDeviceProfile> = [
  ...baseColumns,
  column.display({
    id: 'edit',
    header: 'Change',
    cell: (info) => (info.row.original.source === 'lab' ? <CellLink to={paths.editDeviceProfile.href(info.row.original.id)}>Edit profile</CellLink> : '—'),
  }),
];

/** Every device profile a rig channel may name; admins get a link to change the lab's own. */
export function DeviceProfilesTable({ profiles, canEdit }: { profiles: ListedDeviceProfile[]; canEdit: boolean }) {
  return <DataTable caption="Device profiles" columns={canEdit ? adminColumns : baseColumns} data={profiles} />;
}
