import type { Project } from '@shared/schemas/projects';
import { CellLink, DataTable, type DataTableColumns, MonoCell, tableColumns } from '../../../components/data-table';
import { paths } from '../../../config/paths';
import { formatDate } from '../../../lib/format';

const column = tableColumns<Project>();

const columns: DataTableColumns<Project> = [
  column.accessor('code', {
    header: 'Code',
    sortFn: 'alphanumeric',
    cell: (info) => (
      <CellLink to={paths.project.href(info.row.original.id)} mono>
        {info.getValue()}
      </CellLink>
    ),
  }),
  column.accessor('name', { header: 'Name', sortFn: 'text' }),
  column.accessor('organizationName', { header: 'Client', sortFn: 'text' }),
  column.accessor('site', { header: 'Site', sortFn: 'text' }),
  column.accessor('updatedAt', {
    header: 'Updated',
    sortFn: 'alphanumeric',
    cell: (info) => <MonoCell>{formatDate(info.getValue())}</MonoCell>,
  }),
];

export function ProjectsTable({ projects }: { projects: Project[] }) {
  return <DataTable caption="Projects" columns={columns} data={projects} initialSorting={[{ id: 'updatedAt', desc: true }]} />;
}
