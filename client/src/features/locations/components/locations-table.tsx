import type { TestLocation } from '@shared/schemas/projects';
import { CellLink, DataTable, type DataTableColumns, MonoCell, tableColumns } from '../../../components/data-table';
import { formatNumber } from '../../../components/readout';
import { paths } from '../../../config/paths';

const column = tableColumns<TestLocation>();
const metres = (value: number | null | undefined) => <MonoCell>{formatNumber(value)}</MonoCell>;

const columns: DataTableColumns<TestLocation> = [
  column.accessor('pitId', {
    header: 'Pit',
    sortFn: 'alphanumeric',
    cell: (info) => (
      <CellLink to={paths.location.href(info.row.original.id)} mono>
        {info.getValue()}
      </CellLink>
    ),
  }),
  column.accessor('testDepthM', { header: 'Depth (m)', sortFn: 'basic', cell: (info) => metres(info.getValue()) }),
  // null (not recorded) becomes undefined so that it sorts last rather than as zero
  column.accessor((l) => l.waterTableDepthM ?? undefined, {
    id: 'waterTableDepthM',
    header: 'Water table (m)',
    sortFn: 'basic',
    sortUndefined: 'last',
    cell: (info) => metres(info.getValue()),
  }),
  column.accessor((l) => l.pitWidthM ?? undefined, {
    id: 'pitWidthM',
    header: 'Pit width (m)',
    sortFn: 'basic',
    sortUndefined: 'last',
    cell: (info) => metres(info.getValue()),
  }),
  column.accessor('soilDescription', { header: 'Soil', sortFn: 'text', cell: (info) => <span className="line-clamp-2">{info.getValue()}</span> }),
];

export function LocationsTable({ locations }: { locations: TestLocation[] }) {
  return <DataTable caption="Test locations" columns={columns} data={locations} initialSorting={[{ id: 'pitId', desc: false }]} />;
}
